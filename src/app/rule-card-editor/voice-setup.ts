import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import {
  VOICE_ROLES,
  defaultGrouping,
  defaultRole,
  type VoiceId,
} from '../../../shared/generator/index';
import { VOICE_LABELS } from '../drills/playback/playback-panel';
import { inputText } from '../rule-cards/input-text';
import { CardEditorStore } from './card-editor-store';
import { cardVoices, type CardDraft } from './card-draft';

type LayerDraft = NonNullable<CardDraft['layers']>[number];
type Role = (typeof VOICE_ROLES)[number];

/** The role choice that leaves the voice to the engine's default. */
const DEFAULT = 'default';

/** The engine takes at most this many extra time-keeping layers. */
export const MAX_LAYERS = 4;

/** "2+2+3", "2, 2, 3" or "2 2 3" as numbers; null when a part is not a whole number. */
export function parseNumberList(text: string): number[] | null {
  const parts = text.split(/[\s+,]+/).filter((part) => part !== '');
  const numbers = parts.map(Number);
  return numbers.every((n) => Number.isInteger(n)) ? numbers : null;
}

/**
 * The groove's make-up beyond the grid: how the beats group (compound and odd meters), each
 * voice's role and fill step, and further time-keeping layers (e.g. the hi-hat foot on 2 and 4).
 */
@Component({
  selector: 'tensile-voice-setup',
  imports: [MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule],
  templateUrl: './voice-setup.html',
  styleUrl: './voice-setup.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class VoiceSetup {
  protected readonly store = inject(CardEditorStore);
  protected readonly card = this.store.card;
  protected readonly labels = VOICE_LABELS;
  protected readonly roleChoices = VOICE_ROLES;
  protected readonly roleLabels: Readonly<Record<Role, string>> = {
    time: 'Time (keeps its pattern)',
    anchor: 'Anchor',
    embellishment: 'Embellishment',
    colour: 'Colour',
  };
  protected readonly stepChoices: readonly { step: number; label: string }[] = [
    { step: 1, label: 'Any slot' },
    { step: 2, label: 'Every 2nd slot' },
    { step: 3, label: 'Every 3rd slot' },
    { step: 4, label: 'Every 4th slot' },
  ];
  protected readonly maxLayers = MAX_LAYERS;
  protected readonly defaultChoice = DEFAULT;
  protected readonly voices = computed(() => cardVoices(this.card()));
  protected readonly layers = computed(() => this.card().layers ?? []);
  /** What the teacher typed where it is not a list of numbers yet, by field. */
  protected readonly unreadable = signal<Readonly<Record<string, string>>>({});

  protected readonly usualGrouping = computed(() => {
    const meter = this.card().meter;
    const usual = meter ? defaultGrouping({ beats: meter.beats, unit: meter.unit ?? 4 }) : null;
    return usual ? usual.join('+') : 'every beat on its own';
  });

  protected issues(path: string): string[] {
    return this.store.issues(path);
  }

  protected errorState(path: string) {
    return {
      isErrorState: () => !!this.unreadable()[path] || this.issues(path).length > 0,
    };
  }

  protected listText(list: readonly number[] | undefined, joiner: string): string {
    return list ? list.join(joiner) : '';
  }

  protected setGrouping(event: Event): void {
    const numbers = this.read(
      'meter.grouping',
      event,
      'Write the groups as whole numbers joined by +, e.g. 2+2+3.',
    );
    if (numbers === undefined) return;
    this.store.edit((card) => {
      if (!card.meter) card.meter = { beats: 4, unit: 4 };
      if (numbers === null) delete card.meter.grouping;
      else card.meter.grouping = numbers;
    }, 'meter.grouping');
  }

  /** The role the engine gives `voice` when the card leaves it to the default. */
  protected defaultRole(voice: VoiceId): Role {
    return defaultRole(this.card(), voice);
  }

  /** The voice's own role, or DEFAULT (a value of its own: a select shows null as empty). */
  protected role(voice: VoiceId): Role | typeof DEFAULT {
    return this.card().roles?.[voice] ?? DEFAULT;
  }

  protected setRole(voice: VoiceId, role: Role | typeof DEFAULT | null): void {
    this.store.edit((card) => {
      const roles = { ...(card.roles ?? {}) };
      if (role === null || role === DEFAULT) delete roles[voice];
      else roles[voice] = role;
      if (Object.keys(roles).length === 0) delete card.roles;
      else card.roles = roles;
    });
  }

  /** The voice's fill step: fills only on every n-th slot of the beat (1: any slot). */
  protected fillStep(voice: VoiceId): number {
    return this.card().fillStep?.[voice] ?? 1;
  }

  protected setFillStep(voice: VoiceId, step: number): void {
    this.store.edit((card) => {
      const steps = { ...(card.fillStep ?? {}) };
      if (step <= 1) delete steps[voice];
      else steps[voice] = step;
      if (Object.keys(steps).length === 0) delete card.fillStep;
      else card.fillStep = steps;
    });
  }

  protected addLayer(): void {
    this.store.edit((card) => {
      const voices = cardVoices(card);
      const taken = new Set([card.ostinato?.voice, ...(card.layers ?? []).map((l) => l.voice)]);
      // The hi-hat foot on 2 and 4 is the usual extra layer (common practice); else a free voice.
      const free = voices.filter((v) => !taken.has(v));
      const voice = free.includes('hihatFoot')
        ? 'hihatFoot'
        : (free[0] ?? voices[0] ?? 'hihatFoot');
      card.layers = [
        ...(card.layers ?? []),
        { voice, slots: [0], beats: [2, 4], dynamic: 'normal' },
      ];
    });
  }

  protected removeLayer(index: number): void {
    this.store.edit((card) => {
      const layers = (card.layers ?? []).filter((_, i) => i !== index);
      if (layers.length === 0) delete card.layers;
      else card.layers = layers;
    });
  }

  protected setLayer<K extends keyof LayerDraft>(
    index: number,
    field: K,
    value: LayerDraft[K],
  ): void {
    this.store.edit((card) => {
      const layers = [...(card.layers ?? [])];
      const layer: LayerDraft = { ...layers[index]!, [field]: value };
      if (value === undefined) delete layer[field];
      layers[index] = layer;
      card.layers = layers;
    });
  }

  protected setLayerList(index: number, field: 'slots' | 'beats', event: Event): void {
    const path = `layers[${index}].${field}`;
    const hint =
      field === 'slots'
        ? 'Write the slots as whole numbers, e.g. 0, 2.'
        : 'Write the beats as whole numbers, e.g. 2, 4 (empty: every beat).';
    const numbers = this.read(path, event, hint);
    if (numbers === undefined) return;
    // No beats means every beat; no slots is left for the engine to refuse in its own words.
    this.setLayer(index, field, numbers ?? (field === 'slots' ? [] : undefined));
  }

  protected localProblem(path: string): string | null {
    return this.unreadable()[path] ?? null;
  }

  /**
   * A typed list: the numbers, null when the field is empty, undefined (and a message beside the
   * field) when it cannot be read.
   */
  private read(path: string, event: Event, problem: string): number[] | null | undefined {
    const text = inputText(event).trim();
    const numbers = text === '' ? null : parseNumberList(text);
    const rest = { ...this.unreadable() };
    delete rest[path];
    if (text !== '' && numbers === null) {
      this.unreadable.set({ ...rest, [path]: problem });
      return undefined;
    }
    this.unreadable.set(rest);
    return numbers;
  }
}
