/**
 * Where the card says notes must be and must not be, worked out by the oracle alone (its own grid
 * arithmetic, its own Bjorklund, its own shifts and cycles). Nothing here comes from the engine.
 *
 * Each rule's positions follow the drill contract and docs/engine.md word for word:
 * - backbeat: beat `b` slot 0 moved by `shift` slots; the shift counts the slots of the beat it
 *   lies in and, crossing into a neighbouring beat, that beat's slots: which is walking `shift`
 *   steps along the drill's flattened grid. Past either end of the drill it wraps (drills are
 *   loops).
 * - avoidDownbeat: silent on beat 1 slot 0 of avoided bars; resolution bars 1, 1+N, … (landing
 *   "start") or N, 2N, … (landing "end") must hit it; `resolveEvery` 0 never resolves; with
 *   `anticipate` the last slot before each avoided downbeat is hit (before bar 1: the drill's last
 *   slot).
 * - polyrhythm: hit i at i·span/against beats from each cycle start, cycles every `span` beats from
 *   the drill's start through the drill; a cycle cut by the drill's end loses its later hits (they
 *   are not moved, so they do not wrap); hit i uses voices[i mod voices.length].
 * - euclid: E(pulses, steps) turned left by `rotation` steps; step j lies j·span/steps beats after
 *   its cycle's start; cycles as for polyrhythm.
 * - phrase: the last `fillBeats` beats of bars N, 2N, … are the fill window; the landing is beat 1
 *   of the bar after each (bar 1 after the last); hand time layers rest in the window and a
 *   landing crash replaces the time cymbals on its instant.
 */
import { bjorklund, rotateLeft } from './bjorklund';
import { isHand, rulesOf, TIME_CYMBALS, type OracleCard, type TimeLayer, type Voice } from './card';
import { Grid, mod } from './grid';

/** The parts of a card that place notes at positions the card alone decides. */
export type FixedPart =
  'ostinato' | 'backbeat' | 'avoidDownbeat' | 'phrase' | 'polyrhythm' | 'euclid';

/** The precedence of docs/engine.md ("Drill additions"): earlier names win one voice's instant. */
export const PRECEDENCE = [
  'ostinato',
  'backbeat',
  'avoidDownbeat',
  'phrase',
  'polyrhythm',
  'euclid',
  'anchor',
  'fill',
] as const;
export type Source = (typeof PRECEDENCE)[number];

export interface Want {
  readonly part: FixedPart;
  /** The check that reports this note missing. */
  readonly check: string;
  readonly voice: Voice;
  readonly index: number;
  /** The rule (or layer) in the teacher's words, for messages. */
  readonly why: string;
}

export interface Plan {
  readonly grid: Grid;
  readonly card: OracleCard;
  /** Every (voice, instant) a fixed part of the card demands. */
  readonly wants: readonly Want[];
  /** (voice, index) → the fixed parts that want it. */
  readonly wantedBy: ReadonlyMap<string, readonly Want[]>;
  /** Downbeats each voice must leave silent (avoidDownbeat), with the rule's words. */
  readonly silent: readonly { voice: Voice; index: number; why: string }[];
  /** Downbeats that any avoidDownbeat rule keeps free (for embellishment fills). */
  readonly freeDownbeats: ReadonlySet<number>;
  /** Per avoidDownbeat rule: its resolution bars. */
  readonly resolutionBars: ReadonlyMap<Voice, ReadonlySet<number>>;
  /** Phrase: fill-window slot indices, fill bars, landing bars, the landing crash flag. */
  readonly fillWindow: ReadonlySet<number>;
  readonly fillBars: readonly number[];
  readonly landingBars: ReadonlySet<number>;
  readonly crashLands: boolean;
  /** (voice, index) where a time layer rests (phrase fill window, crash landing). */
  readonly rests: ReadonlySet<string>;
  /**
   * (voice, index) of the time cymbal on beat 1 of bar 1 when a colour crash may take its place
   * (no phrase rule): the cymbal is wanted there unless the crash sounds, and absent if it does.
   */
  readonly yields: ReadonlySet<string>;
  /**
   * Beat starts a moved backbeat (shift not 0) left: no fill note sounds there (docs/engine.md,
   * "Backbeats"; common practice: an early backbeat is heard by the hole it leaves).
   */
  readonly movedHomes: ReadonlySet<number>;
  /** Voices a euclid or polyrhythm rule plays. */
  readonly figureVoices: ReadonlySet<Voice>;
  /** Positions of polyrhythm / euclid rules that fall between slots (parse should refuse). */
  readonly offGrid: readonly string[];
  /** The tension target of each bar (1-based), or null without a tension rule. */
  readonly targets: readonly number[] | null;
}

export const key = (voice: string, index: number): string => `${voice}@${index}`;

export function planOf(card: OracleCard): Plan {
  const grid = new Grid(card.subs, card.bars);
  const wants: Want[] = [];
  const silent: { voice: Voice; index: number; why: string }[] = [];
  const freeDownbeats = new Set<number>();
  const resolutionBars = new Map<Voice, Set<number>>();
  const offGrid: string[] = [];
  const movedHomes = new Set<number>();
  const bars = Array.from({ length: card.bars }, (_, i) => i + 1);
  const has = (v: Voice): boolean => card.voices.includes(v);

  // Phrase windows and landings.
  const fillWindow = new Set<number>();
  const fillBars: number[] = [];
  const landingBars = new Set<number>();
  let crashLands = false;
  for (const rule of rulesOf(card, 'phrase')) {
    crashLands = rule.crash && has('crash');
    for (let bar = rule.every; bar <= card.bars; bar += rule.every) {
      fillBars.push(bar);
      const landing = (bar % card.bars) + 1;
      landingBars.add(landing);
      const first = card.beatsPerBar - rule.fillBeats + 1;
      for (let beat = Math.max(1, first); beat <= card.beatsPerBar; beat++)
        for (let slot = 0; slot < grid.slotsIn(beat); slot++)
          fillWindow.add(grid.index(bar, beat, slot));
      const at = grid.downbeat(landing);
      const why = `the ${rule.every}-bar phrase's landing on bar ${landing}`;
      if (has('kick'))
        wants.push({ part: 'phrase', check: 'phrase/landing-kick', voice: 'kick', index: at, why });
      if (crashLands)
        wants.push({
          part: 'phrase',
          check: 'phrase/landing-crash',
          voice: 'crash',
          index: at,
          why,
        });
    }
  }

  // Time layers, with their rests.
  const rests = new Set<string>();
  const yields = new Set<string>();
  const colourCrash = card.roles.get('crash') === 'colour' && rulesOf(card, 'phrase').length === 0;
  // "The time cymbal": the one the leading hand plays for its whole pattern (docs/engine.md,
  // "Sticking"): the ostinato's voice when it is a cymbal, else the first cymbal layer.
  const timeCymbal = card.timeLayers.find((l) => TIME_CYMBALS.has(l.voice))?.voice;
  const restsAt = (layer: TimeLayer, index: number): boolean =>
    (isHand(layer.voice) && fillWindow.has(index)) ||
    (crashLands &&
      layer.voice === timeCymbal &&
      landingBars.has(grid.barOf(index)) &&
      index === grid.downbeat(grid.barOf(index)));
  for (const layer of card.timeLayers) {
    const why = layer.isOstinato ? `the ${layer.voice} ostinato` : `the ${layer.voice} layer`;
    for (const bar of bars)
      for (const beat of layer.beats)
        for (const slot of layer.slots) {
          if (slot >= grid.slotsIn(beat)) continue; // parse refuses such cards
          const index = grid.index(bar, beat, slot);
          if (colourCrash && layer.voice === timeCymbal && index === 0)
            yields.add(key(layer.voice, 0));
          if (restsAt(layer, index)) rests.add(key(layer.voice, index));
          else {
            const check = layer.isOstinato ? 'ostinato' : 'layers';
            wants.push({ part: 'ostinato', check, voice: layer.voice, index, why });
          }
        }
  }

  for (const rule of card.rules) {
    switch (rule.kind) {
      case 'backbeat': {
        const why = `the ${rule.voice} backbeat on beats ${rule.beats.join(', ')} shifted ${rule.shift}`;
        for (const bar of rule.bars ?? bars)
          for (const beat of rule.beats) {
            const index = mod(grid.index(bar, beat, 0) + rule.shift, grid.totalSlots);
            if (rule.shift !== 0) movedHomes.add(grid.index(bar, beat, 0));
            wants.push({ part: 'backbeat', check: 'backbeat', voice: rule.voice, index, why });
          }
        break;
      }
      case 'avoidDownbeat': {
        const n = rule.resolveEvery;
        const resolves = (bar: number): boolean =>
          n > 0 && (rule.landing === 'start' ? (bar - 1) % n === 0 : bar % n === 0);
        const mine = resolutionBars.get(rule.voice) ?? new Set<number>();
        resolutionBars.set(rule.voice, mine);
        const why = `the ${rule.voice} avoidDownbeat rule (resolveEvery ${n}, landing ${rule.landing})`;
        for (const bar of bars) {
          const down = grid.downbeat(bar);
          if (resolves(bar)) {
            mine.add(bar);
            wants.push({
              part: 'avoidDownbeat',
              check: 'avoidDownbeat/resolve',
              voice: rule.voice,
              index: down,
              why,
            });
          } else {
            silent.push({ voice: rule.voice, index: down, why });
            freeDownbeats.add(down);
            if (rule.anticipate) {
              const index = mod(down - 1, grid.totalSlots);
              wants.push({
                part: 'avoidDownbeat',
                check: 'avoidDownbeat/anticipate',
                voice: rule.voice,
                index,
                why,
              });
            }
          }
        }
        break;
      }
      case 'polyrhythm': {
        const why = `the ${rule.against}-over-${rule.span} polyrhythm on ${rule.voices.join(', ')}`;
        for (let start = 0; start < grid.totalBeats; start += rule.span)
          for (let i = 0; i < rule.against; i++) {
            // start + i·span/against beats, as the rational (start·against + i·span) / against
            const index = grid.atBeats(start * rule.against + i * rule.span, rule.against);
            if (index === null) {
              offGrid.push(`${why}: hit ${i} of the cycle at beat ${start} falls between slots`);
              continue;
            }
            if (index >= grid.totalSlots) continue; // cut off by the drill's end
            const voice = rule.voices[i % rule.voices.length]!;
            wants.push({ part: 'polyrhythm', check: 'polyrhythm', voice, index, why });
          }
        break;
      }
      case 'euclid': {
        const why = `the Euclidean E(${rule.pulses},${rule.steps}) rotated ${rule.rotation} on ${rule.voice}`;
        const pattern = rotateLeft(bjorklund(rule.pulses, rule.steps), rule.rotation);
        for (let start = 0; start < grid.totalBeats; start += rule.span)
          for (let j = 0; j < rule.steps; j++) {
            const index = grid.atBeats(start * rule.steps + j * rule.span, rule.steps);
            if (index === null) {
              offGrid.push(`${why}: step ${j} of the cycle at beat ${start} falls between slots`);
              continue;
            }
            if (!pattern[j] || index >= grid.totalSlots) continue;
            wants.push({ part: 'euclid', check: 'euclid', voice: rule.voice, index, why });
          }
        break;
      }
      default:
        break;
    }
  }

  const wantedBy = new Map<string, Want[]>();
  for (const want of wants) {
    const k = key(want.voice, want.index);
    wantedBy.set(k, [...(wantedBy.get(k) ?? []), want]);
  }

  const figureVoices = new Set<Voice>();
  for (const rule of rulesOf(card, 'polyrhythm')) for (const v of rule.voices) figureVoices.add(v);
  for (const rule of rulesOf(card, 'euclid')) figureVoices.add(rule.voice);

  const tension = rulesOf(card, 'tension')[0];
  const targets = tension
    ? bars.map((bar) => tension.curve[(bar - 1) % tension.curve.length]!)
    : null;

  return {
    grid,
    card,
    wants,
    wantedBy,
    silent,
    freeDownbeats,
    resolutionBars,
    fillWindow,
    fillBars,
    landingBars,
    crashLands,
    rests,
    yields,
    movedHomes,
    figureVoices,
    offGrid,
    targets,
  };
}
