import {
  CdkDrag,
  CdkDragHandle,
  CdkDropList,
  moveItemInArray,
  type CdkDragDrop,
} from '@angular/cdk/drag-drop';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import type { RuleKind } from '../../../shared/generator/index';
import { CardEditorStore } from './card-editor-store';
import { RULE_KINDS, RULE_KIND_LABELS, newRule, ruleSummary } from './card-draft';
import { conflictFor, issuesExactlyAt } from './card-preview-outcome';
import { RuleFields } from './rule-fields';

/**
 * The card's rules in order: add one of each kind, edit its fields, reorder by dragging or with
 * the move buttons (Alt+Arrow keys on a rule), remove. Engine messages sit on the rule they name.
 */
@Component({
  selector: 'tensile-rule-list',
  imports: [
    CdkDropList,
    CdkDrag,
    CdkDragHandle,
    MatButtonModule,
    MatIconModule,
    MatMenuModule,
    RuleFields,
  ],
  templateUrl: './rule-list.html',
  styleUrl: './rule-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RuleList {
  protected readonly store = inject(CardEditorStore);
  protected readonly kinds = RULE_KINDS;
  protected readonly kindLabels = RULE_KIND_LABELS;
  protected readonly rules = computed(() =>
    (this.store.card().rules ?? []).map((rule, index) => ({
      index,
      kind: rule.kind,
      label: RULE_KIND_LABELS[rule.kind] ?? rule.kind,
      summary: safeSummary(rule),
    })),
  );

  /** Whole-rule messages: the engine's conflict naming this kind, or a problem on the rule itself. */
  protected messages(index: number, kind: RuleKind): string[] {
    const conflict = conflictFor(this.store.outcome(), kind);
    const own = issuesExactlyAt(this.store.outcome(), `rules[${index}]`);
    return [...(conflict ? [conflict] : []), ...own];
  }

  protected add(kind: RuleKind): void {
    this.store.edit((card) => {
      card.rules = [...(card.rules ?? []), newRule(kind, card)];
    });
  }

  protected remove(index: number): void {
    this.store.edit((card) => {
      card.rules = (card.rules ?? []).filter((_, i) => i !== index);
    });
  }

  protected move(from: number, to: number): void {
    const count = this.store.card().rules?.length ?? 0;
    if (from === to || to < 0 || to >= count) return;
    this.store.edit((card) => {
      if (card.rules) moveItemInArray(card.rules, from, to);
    });
  }

  protected dropped(event: CdkDragDrop<unknown>): void {
    this.move(event.previousIndex, event.currentIndex);
  }

  protected keyMove(event: KeyboardEvent, index: number): void {
    if (!event.altKey) return;
    if (event.key === 'ArrowUp') this.move(index, index - 1);
    else if (event.key === 'ArrowDown') this.move(index, index + 1);
    else return;
    event.preventDefault();
  }
}

function safeSummary(rule: Parameters<typeof ruleSummary>[0]): string {
  try {
    return ruleSummary(rule);
  } catch {
    // A half-typed rule (a list still empty) has no summary yet; its fields say what is missing.
    return '';
  }
}
