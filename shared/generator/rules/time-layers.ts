import { isHandVoice, type VoiceId } from '../drill';
import type { Grid } from '../grid';
import type { RuleCard } from '../schema';
import type { Placement } from './placement';

/** A time-keeping layer as the engine uses it: the ostinato is layer -1, `layers[k]` is k. */
interface TimeLayer {
  readonly voice: VoiceId;
  readonly slots: readonly number[];
  /** 0-based beats it plays; null = every beat. */
  readonly beats: ReadonlySet<number> | null;
  readonly dynamic: Placement['dynamic'];
  readonly rule: number;
}

/** Rule index standing for layer k in placements (the ostinato is -1, fills -2). */
export const layerRule = (k: number): number => -10 - k;

/** The ostinato and every layer. */
export function timeLayers(card: RuleCard): TimeLayer[] {
  const out: TimeLayer[] = [];
  if (card.ostinato) out.push({ ...card.ostinato, beats: null, rule: -1 });
  card.layers.forEach((layer, k) =>
    out.push({
      voice: layer.voice,
      slots: layer.slots,
      beats: layer.beats ? new Set(layer.beats.map((beat) => beat - 1)) : null,
      dynamic: layer.dynamic,
      rule: layerRule(k),
    }),
  );
  return out;
}

/** Cymbals that keep time (common practice): what a crash takes the place of. */
const TIME_CYMBALS: ReadonlySet<VoiceId> = new Set<VoiceId>([
  'hihat',
  'hihatOpen',
  'ride',
  'rideBell',
]);

/** The time cymbal: the first time layer (the ostinato first) played on a cymbal, if any. */
export function timeCymbal(card: RuleCard): VoiceId | null {
  return timeLayers(card).find((layer) => TIME_CYMBALS.has(layer.voice))?.voice ?? null;
}

/**
 * Every time-layer hit (source `ostinato`), except where the hands leave it: hand layers inside
 * a phrase's fill (`resting`), and the time cymbal where a crash takes its place (`crashed`).
 */
export function placeTimeLayers(
  card: RuleCard,
  grid: Grid,
  resting: readonly boolean[],
  crashed: ReadonlySet<number>,
): Placement[] {
  const out: Placement[] = [];
  const cymbal = timeCymbal(card);
  for (const layer of timeLayers(card)) {
    const hand = isHandVoice(layer.voice);
    const yields = layer.voice === cymbal;
    for (let instant = 0; instant < grid.instants; instant++) {
      const inBar = instant % grid.slotsPerBar;
      const beat = grid.beatOf[inBar] ?? 0;
      if (layer.beats && !layer.beats.has(beat)) continue;
      if (!layer.slots.includes(grid.slotOf[inBar] ?? 0)) continue;
      if ((hand && resting[instant]) || (yields && crashed.has(instant))) continue;
      out.push({
        instant,
        voice: layer.voice,
        source: 'ostinato',
        dynamic: layer.dynamic,
        rule: layer.rule,
      });
    }
  }
  return out;
}
