import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';
import type { VoiceId } from '../../../shared/generator/index';
import { VOICE_LABELS } from '../drills/playback/playback-panel';
import { CardEditorStore } from './card-editor-store';
import { beatSlots, cardVoices } from './card-draft';

/**
 * The time-keeping voice's ostinato as a grid: one row of slots per beat. The ostinato plays the
 * same slots in every beat, so pressing a slot in any beat turns it on or off in all of them.
 */
@Component({
  selector: 'tensile-ostinato-grid',
  imports: [MatButtonToggleModule, MatCheckboxModule, MatFormFieldModule, MatSelectModule],
  templateUrl: './ostinato-grid.html',
  styleUrl: './ostinato-grid.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class OstinatoGrid {
  protected readonly store = inject(CardEditorStore);
  protected readonly labels = VOICE_LABELS;
  protected readonly ostinato = computed(() => this.store.card().ostinato ?? null);
  protected readonly voices = computed(() => cardVoices(this.store.card()));
  protected readonly beats = computed(() =>
    beatSlots(this.store.card()).map((slots, i) => ({
      beat: i + 1,
      slots: Array.from({ length: slots }, (_, slot) => slot),
    })),
  );
  protected readonly issues = computed(() => this.store.issues('ostinato'));

  protected isOn(slot: number): boolean {
    return this.ostinato()?.slots.includes(slot) ?? false;
  }

  protected toggleOstinato(on: boolean): void {
    this.store.edit((card) => {
      if (!on) {
        delete card.ostinato;
        return;
      }
      const voices = cardVoices(card);
      const voice: VoiceId = voices.includes('hihat') ? 'hihat' : (voices[0] ?? 'hihat');
      card.ostinato = { voice, slots: [0], dynamic: 'normal' };
    });
  }

  protected toggle(slot: number): void {
    this.store.edit((card) => {
      if (!card.ostinato) return;
      const slots = card.ostinato.slots;
      card.ostinato.slots = slots.includes(slot)
        ? slots.filter((s) => s !== slot)
        : [...slots, slot].sort((a, b) => a - b);
    });
  }

  protected setVoice(voice: VoiceId): void {
    this.store.edit((card) => {
      if (card.ostinato) card.ostinato.voice = voice;
    });
  }

  protected setDynamic(dynamic: 'ghost' | 'normal' | 'accent'): void {
    this.store.edit((card) => {
      if (card.ostinato) card.ostinato.dynamic = dynamic;
    });
  }
}
