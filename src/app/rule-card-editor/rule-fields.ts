import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { NgTemplateOutlet } from '@angular/common';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { VOICE_LABELS } from '../drills/playback/playback-panel';
import { CardEditorStore, typedNumber } from './card-editor-store';
import { beatSlots, cardVoices, type RuleDraft } from './card-draft';
import { euclidDots, landingSpans } from './rule-shapes';
import { TensionCurve } from './tension-curve';

/** The fields of one rule, by kind; voice pickers offer only the card's voices. */
@Component({
  selector: 'tensile-rule-fields',
  imports: [
    NgTemplateOutlet,
    MatCheckboxModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    TensionCurve,
  ],
  templateUrl: './rule-fields.html',
  styleUrl: './rule-fields.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RuleFields {
  readonly index = input.required<number>();

  protected readonly store = inject(CardEditorStore);
  protected readonly labels = VOICE_LABELS;
  protected readonly rule = computed(() => this.store.card().rules?.[this.index()] ?? null);
  protected readonly voices = computed(() => cardVoices(this.store.card()));
  protected readonly beatNumbers = computed(() =>
    beatSlots(this.store.card()).map((_, i) => i + 1),
  );
  protected readonly barNumbers = computed(() =>
    Array.from({ length: Math.min(64, this.store.card().bars ?? 4) }, (_, i) => i + 1),
  );
  /** Spans on which every hit of the polyrhythm lands on a slot (and the current one). */
  protected readonly spans = computed(() => {
    const rule = this.rule();
    if (rule?.kind !== 'polyrhythm') return [];
    const slots = beatSlots(this.store.card());
    const total = slots.length * (this.store.card().bars ?? 4);
    return landingSpans(rule.against, slots, total, Math.min(64, Math.max(16, slots.length * 2)));
  });
  protected readonly dots = computed(() => {
    const rule = this.rule();
    return rule?.kind === 'euclid' ? euclidDots(rule.pulses, rule.steps, rule.rotation ?? 0) : [];
  });

  protected dotsText(): string {
    return this.dots()
      .map((on) => (on ? 'x' : '.'))
      .join('');
  }

  protected path(field: string): string {
    return `rules[${this.index()}].${field}`;
  }

  protected issues(field: string): string[] {
    return this.store.issues(this.path(field));
  }

  protected errorState(field: string) {
    return this.store.errorState(this.path(field));
  }

  /** Set one field of this rule; typed fields fold their keystrokes into one undo step. */
  protected set(field: string, value: unknown, typed = false): void {
    this.store.edit(
      (card) => {
        const rule = card.rules?.[this.index()] as Record<string, unknown> | undefined;
        if (!rule) return;
        if (value === undefined || (Array.isArray(value) && value.length === 0 && optional(field)))
          delete rule[field];
        else rule[field] = value;
      },
      typed ? this.path(field) : null,
    );
  }

  protected typed(field: string, text: Event): void {
    this.set(field, typedNumber(text), true);
  }

  protected value(field: string): unknown {
    return (this.rule() as Record<string, unknown> | null)?.[field];
  }

  protected kind(): RuleDraft['kind'] | null {
    return this.rule()?.kind ?? null;
  }
}

/** List fields a rule may leave out (empty means "not set"). */
function optional(field: string): boolean {
  return field === 'bars' || field === 'voices';
}
