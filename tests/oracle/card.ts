/**
 * The oracle's own reading of a rule card. It starts from the card as the teacher wrote it and
 * fills the defaults that the drill contract and docs/engine.md define for rule semantics (spans,
 * landings, phrase fills, roles). Plain values without a documented default (meter, bars,
 * subdivision, tempo, voices, density, hand) are taken from the card the engine normalised, when
 * the written card leaves them out: they name the grid, they carry no rule meaning.
 */

export type Voice =
  | 'kick'
  | 'snare'
  | 'rim'
  | 'hihat'
  | 'hihatOpen'
  | 'hihatFoot'
  | 'ride'
  | 'rideBell'
  | 'crash'
  | 'tomHigh'
  | 'tomMid'
  | 'tomFloor';

/** The voices of the drill contract. */
export const ALL_VOICES: readonly Voice[] = [
  'kick',
  'snare',
  'rim',
  'hihat',
  'hihatOpen',
  'hihatFoot',
  'ride',
  'rideBell',
  'crash',
  'tomHigh',
  'tomMid',
  'tomFloor',
];

/** Drill contract: `kick` is the right foot, `hihatFoot` the left foot, all others hands. */
export const FEET: ReadonlySet<string> = new Set(['kick', 'hihatFoot']);
export const isHand = (voice: string): boolean => !FEET.has(voice);

/** Hand-played cymbals that keep time (what a crash landing replaces). Common practice. */
export const TIME_CYMBALS: ReadonlySet<string> = new Set([
  'hihat',
  'hihatOpen',
  'ride',
  'rideBell',
]);

/**
 * The far side of a right-handed kit: ride and floor tom stand right of the player (common
 * practice); a left-handed kit is the mirror image (docs/engine.md, "Sticking").
 */
export const FAR_SIDE_FOR_LEFT_HAND: ReadonlySet<string> = new Set([
  'ride',
  'rideBell',
  'tomFloor',
]);

/** The far side of a right-handed kit for the right hand: the hi-hat (common practice). */
export const FAR_SIDE_FOR_RIGHT_HAND: ReadonlySet<string> = new Set(['hihat', 'hihatOpen']);

export type Role = 'time' | 'anchor' | 'embellishment' | 'colour';
export type Dynamic = 'ghost' | 'normal' | 'accent';

export interface TimeLayer {
  readonly voice: Voice;
  readonly slots: readonly number[];
  /** Beats of the bar the layer plays (every beat for the ostinato). */
  readonly beats: readonly number[];
  readonly isOstinato: boolean;
}

export type OracleRule =
  | {
      kind: 'backbeat';
      voice: Voice;
      beats: number[];
      shift: number;
      bars: number[] | null;
    }
  | {
      kind: 'avoidDownbeat';
      voice: Voice;
      resolveEvery: number;
      anticipate: boolean;
      landing: 'start' | 'end';
    }
  | { kind: 'fillHoles'; voices: Voice[]; ghost: number; accent: number }
  | { kind: 'linear'; maxOverlaps: number }
  | { kind: 'polyrhythm'; voices: Voice[]; against: number; span: number }
  | {
      kind: 'euclid';
      voice: Voice;
      pulses: number;
      steps: number;
      rotation: number;
      span: number;
    }
  | { kind: 'tension'; curve: number[] }
  | { kind: 'phrase'; every: number; fillBeats: number; voices: Voice[]; crash: boolean };

export interface OracleCard {
  readonly beatsPerBar: number;
  readonly subs: readonly number[];
  readonly bars: number;
  readonly tempo: number;
  readonly voices: readonly Voice[];
  readonly ostinato: TimeLayer | null;
  /** The ostinato (first, when there is one) and every layer. */
  readonly timeLayers: readonly TimeLayer[];
  readonly roles: ReadonlyMap<Voice, Role>;
  /** docs/engine.md "Fill steps": a voice's fills only on slots of the beat that are multiples. */
  readonly fillStep: ReadonlyMap<Voice, number>;
  readonly hand: 'right' | 'left';
  /** docs/engine.md "Sticking": the lead defaults to the player's hand. */
  readonly lead: 'right' | 'left' | 'alternate';
  readonly doubles: boolean;
  readonly rules: readonly OracleRule[];
  /** Beats per group of the meter, or null where each beat stands alone. */
  readonly grouping: readonly number[] | null;
  readonly measure: 'lhl' | 'witek';
}

type Loose = Record<string, unknown>;
const obj = (v: unknown): Loose => (v !== null && typeof v === 'object' ? (v as Loose) : {});
const num = (v: unknown, fallback: number): number => (typeof v === 'number' ? v : fallback);
const range = (n: number): number[] => Array.from({ length: n }, (_, i) => i + 1);

/** Phrase fill voices by default: the card's snare and toms, high to low (docs/engine.md). */
const DEFAULT_FILL_ORDER: readonly Voice[] = ['snare', 'tomHigh', 'tomMid', 'tomFloor'];

/**
 * Reads `written` (the card as written) with `normalised` (the engine's normalised card, or the
 * output of the public parseRuleCard) supplying the plain values the written card leaves out.
 */
export function readCard(written: unknown, normalised: unknown): OracleCard {
  const w = obj(written);
  const n = obj(normalised);
  const pick = (key: string): unknown => (key in w ? w[key] : n[key]);

  const meter = obj(pick('meter'));
  const beatsPerBar = num(meter['beats'], 4);
  const unit = num(meter['unit'], 4);
  const grouping =
    (meter['grouping'] as number[] | undefined) ?? defaultGrouping(beatsPerBar, unit);
  const measure = pick('measure') === 'witek' ? 'witek' : 'lhl';
  const sub = pick('subdivision');
  const subs = Array.isArray(sub)
    ? (sub as number[]).slice()
    : Array.from({ length: beatsPerBar }, () => num(sub, 4));
  const bars = num(pick('bars'), 4);
  const voices = (pick('voices') as Voice[] | undefined) ?? [];
  const allBeats = range(beatsPerBar);

  const o = w['ostinato'] === undefined ? null : obj(w['ostinato']);
  const ostinato: TimeLayer | null = o
    ? {
        voice: o['voice'] as Voice,
        slots: o['slots'] as number[],
        beats: allBeats,
        isOstinato: true,
      }
    : null;
  const layers: TimeLayer[] = ((w['layers'] as unknown[] | undefined) ?? []).map((l) => {
    const layer = obj(l);
    return {
      voice: layer['voice'] as Voice,
      slots: layer['slots'] as number[],
      beats: (layer['beats'] as number[] | undefined) ?? allBeats,
      isOstinato: false,
    };
  });
  const timeLayers = ostinato ? [ostinato, ...layers] : layers;

  // Role defaults, docs/engine.md "Voice roles": time for the ostinato's and every layer's voice
  // and for hihatFoot; anchor for kick; colour for crash; embellishment otherwise. The card's own
  // roles win.
  const written_roles = obj(w['roles']);
  const roles = new Map<Voice, Role>();
  for (const v of voices) {
    let role: Role = 'embellishment';
    if (timeLayers.some((l) => l.voice === v) || v === 'hihatFoot') role = 'time';
    else if (v === 'kick') role = 'anchor';
    else if (v === 'crash') role = 'colour';
    roles.set(v, (written_roles[v] as Role | undefined) ?? role);
  }

  const fillStep = new Map<Voice, number>();
  for (const [v, step] of Object.entries(obj(w['fillStep'])))
    if (typeof step === 'number' && step > 1) fillStep.set(v as Voice, step);

  const rules: OracleRule[] = ((w['rules'] as unknown[] | undefined) ?? []).map((r) => {
    const rule = obj(r);
    switch (rule['kind']) {
      case 'backbeat':
        return {
          kind: 'backbeat',
          voice: rule['voice'] as Voice,
          beats: rule['beats'] as number[],
          shift: num(rule['shift'], 0),
          bars: (rule['bars'] as number[] | undefined) ?? null,
        };
      case 'avoidDownbeat':
        return {
          kind: 'avoidDownbeat',
          voice: rule['voice'] as Voice,
          resolveEvery: num(rule['resolveEvery'], 0),
          anticipate: rule['anticipate'] === true,
          landing: rule['landing'] === 'end' ? 'end' : 'start',
        };
      case 'fillHoles':
        return {
          kind: 'fillHoles',
          voices: rule['voices'] as Voice[],
          ghost: num(rule['ghost'], 0),
          accent: num(rule['accent'], 0),
        };
      case 'linear':
        return { kind: 'linear', maxOverlaps: num(rule['maxOverlaps'], 0) };
      case 'polyrhythm':
        return {
          kind: 'polyrhythm',
          voices: rule['voices'] as Voice[],
          against: rule['against'] as number,
          // The drill contract: a span defaults to one bar.
          span: num(rule['span'], beatsPerBar),
        };
      case 'euclid':
        return {
          kind: 'euclid',
          voice: rule['voice'] as Voice,
          pulses: rule['pulses'] as number,
          steps: rule['steps'] as number,
          rotation: num(rule['rotation'], 0),
          span: num(rule['span'], beatsPerBar),
        };
      case 'tension':
        return { kind: 'tension', curve: rule['curve'] as number[] };
      case 'phrase':
        return {
          kind: 'phrase',
          every: rule['every'] as number,
          // docs/engine.md "Phrases": the fill takes the whole bar by default, around the card's
          // snare and toms, high to low; the crash lands with the kick unless crash is false.
          fillBeats: num(rule['fillBeats'], beatsPerBar),
          voices:
            (rule['voices'] as Voice[] | undefined) ??
            DEFAULT_FILL_ORDER.filter((v) => voices.includes(v)),
          crash: rule['crash'] !== false,
        };
      default:
        throw new Error(`The oracle does not know rule kind ${String(rule['kind'])}`);
    }
  });

  const sticking = obj(w['sticking']);
  const hand = pick('hand') === 'left' ? 'left' : 'right';
  const lead = sticking['lead'];
  return {
    beatsPerBar,
    subs,
    bars,
    tempo: num(pick('tempo'), 90),
    voices,
    ostinato,
    timeLayers,
    roles,
    fillStep,
    hand,
    lead: lead === 'left' || lead === 'right' || lead === 'alternate' ? lead : hand,
    doubles: sticking['doubles'] === true,
    rules,
    grouping,
    measure,
  };
}

/**
 * The meter's grouping when the card gives none (docs/engine.md, "Meter grouping"; common
 * practice): x/8 and x/16 meters of four beats or more group in threes when the beats divide by
 * three (compound time), 5 as 3+2, 7 as 2+2+3, 11 as 3+3+3+2, 13 as 3+3+3+2+2, other even counts
 * in twos; quarter- and half-note meters and bars of one to three beats stand ungrouped.
 */
export function defaultGrouping(beats: number, unit: number): number[] | null {
  if (unit < 8 || beats < 4) return null;
  if (beats % 3 === 0) return Array<number>(beats / 3).fill(3);
  const odd: Record<number, number[]> = {
    5: [3, 2],
    7: [2, 2, 3],
    11: [3, 3, 3, 2],
    13: [3, 3, 3, 2, 2],
  };
  return odd[beats] ?? Array<number>(beats / 2).fill(2);
}

export function rulesOf<K extends OracleRule['kind']>(
  card: OracleCard,
  kind: K,
): Extract<OracleRule, { kind: K }>[] {
  return card.rules.filter((r): r is Extract<OracleRule, { kind: K }> => r.kind === kind);
}
