import { NgTemplateOutlet } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { VOICE_IDS } from '../../../shared/generator/index';
import { VOICE_LABELS } from '../drills/playback/playback-panel';
import { subdivisionLabel } from '../rule-cards/card-labels';
import { CardEditorStore, typedNumber } from './card-editor-store';
import { beatSlots, type CardDraft } from './card-draft';

type NumberKey = 'beats' | 'bars' | 'tempo' | 'density';

/** One of the card's typed numbers: where it sits in the card, and the range the engine takes. */
interface NumberField {
  readonly key: NumberKey;
  readonly path: string;
  readonly label: string;
  readonly min: number;
  readonly max: number;
  readonly step?: number;
  readonly hint?: string;
}

const NUMBER_FIELDS: Readonly<Record<NumberKey, NumberField>> = {
  beats: { key: 'beats', path: 'meter.beats', label: 'Beats per bar', min: 1, max: 15 },
  bars: { key: 'bars', path: 'bars', label: 'Bars', min: 1, max: 64 },
  tempo: { key: 'tempo', path: 'tempo', label: 'Tempo (BPM)', min: 20, max: 320 },
  density: {
    key: 'density',
    path: 'density',
    label: 'Density (0–1)',
    min: 0,
    max: 1,
    step: 0.05,
    hint: 'Share of free slots filled',
  },
};

/** The card's frame: meter, bars, grid, tempo, voices, density and the player's feel. */
@Component({
  selector: 'tensile-card-basics',
  imports: [
    MatButtonToggleModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    NgTemplateOutlet,
  ],
  templateUrl: './card-basics.html',
  styleUrl: './card-basics.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CardBasics {
  protected readonly store = inject(CardEditorStore);
  protected readonly allVoices = VOICE_IDS;
  protected readonly labels = VOICE_LABELS;
  protected readonly slotChoices = [1, 2, 3, 4, 5, 6, 7, 8];
  protected readonly card = this.store.card;
  protected readonly perBeat = computed(() => Array.isArray(this.card().subdivision));
  protected readonly slots = computed(() => beatSlots(this.card()));
  protected readonly unit = computed(() => this.card().meter?.unit ?? 4);
  protected readonly numbers = NUMBER_FIELDS;

  /** What a number field shows: the card's value, or nothing while it is unset. */
  protected numberValue(key: NumberKey): number | string {
    const card = this.card();
    return (key === 'beats' ? card.meter?.beats : card[key]) ?? '';
  }

  protected slotLabel(slots: number): string {
    return `${slots} · ${subdivisionLabel(slots, { unit: this.unit() })}`;
  }

  protected issues(path: string): string[] {
    return this.store.issues(path);
  }

  protected errorState(path: string) {
    return this.store.errorState(path);
  }

  protected typed(path: NumberKey, text: Event): void {
    const value = typedNumber(text);
    this.store.edit((card) => {
      if (path === 'beats') {
        card.meter = { ...(card.meter ?? { unit: 4 }), beats: value as number };
        delete card.meter.grouping;
        // Per-beat grids follow the new beat count so the card stays consistent.
        if (Array.isArray(card.subdivision) && typeof value === 'number' && value > 0) {
          const list = card.subdivision;
          card.subdivision = Array.from({ length: value }, (_, i) => list[i] ?? list.at(-1) ?? 4);
        }
      } else {
        (card as Record<string, unknown>)[path] = value;
      }
    }, path);
  }

  protected set<K extends keyof CardDraft>(field: K, value: CardDraft[K]): void {
    this.store.edit((card) => {
      if (value === undefined) delete card[field];
      else card[field] = value;
    });
  }

  protected setUnit(unit: 2 | 4 | 8 | 16): void {
    this.store.edit((card) => {
      card.meter = { ...(card.meter ?? { beats: 4 }), unit };
    });
  }

  protected setPerBeat(perBeat: boolean): void {
    this.store.edit((card) => {
      const slots = beatSlots(card);
      card.subdivision = perBeat ? slots : (slots[0] ?? 4);
    });
  }

  protected setSlots(beat: number | null, slots: number): void {
    this.store.edit((card) => {
      if (beat === null) card.subdivision = slots;
      else {
        const list = beatSlots(card);
        list[beat] = slots;
        card.subdivision = list;
      }
    });
  }

  protected setSticking(field: 'lead' | 'doubles', value: string | boolean | null): void {
    this.store.edit((card) => {
      const sticking: Record<string, unknown> = { ...(card.sticking ?? {}), [field]: value };
      // "The card's own choice" leaves the lead out, so the engine picks it.
      if (sticking['lead'] === null) delete sticking['lead'];
      card.sticking = sticking as CardDraft['sticking'];
    });
  }

  protected setSwing(on: boolean): void {
    this.set('swing', on ? { unit: 8, ratio: 0.6 } : undefined);
  }

  protected setSwingField(field: 'unit' | 'ratio', value: number | undefined): void {
    this.store.edit(
      (card) => {
        if (card.swing) card.swing = { ...card.swing, [field]: value };
      },
      field === 'ratio' ? 'swing.ratio' : null,
    );
  }

  protected typedNumber(text: Event): number | undefined {
    return typedNumber(text);
  }
}
