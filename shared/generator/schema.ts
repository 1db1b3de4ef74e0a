import * as z from 'zod';
import { VOICE_IDS, type VoiceId } from './drill';
import { listWords } from './words';

/**
 * Zod schemas for the rule card: the single source of its types. Every message names the field
 * and its allowed range in a teacher's words; `parse.ts` adds the rule number and runs the checks
 * that need more than one field.
 */

type Issue = { input?: unknown };
const got = (iss: Issue): string => (iss.input === undefined ? '' : ` (got ${show(iss.input)})`);
const show = (value: unknown): string =>
  typeof value === 'string' ? `"${value}"` : (JSON.stringify(value) ?? String(value));

/** A whole number in [min, max], with messages that say `label` and the range. */
function wholeNumber(label: string, min: number, max: number, unit = '') {
  const range = (iss: Issue): string =>
    `${label} must be between ${min} and ${max}${unit}${got(iss)}.`;
  const missing = (iss: Issue): string =>
    iss.input === undefined ? `${label} is missing.` : range(iss);
  return z
    .number({ error: missing })
    .int({ error: (iss) => `${label} must be a whole number${got(iss)}.` })
    .min(min, { error: range })
    .max(max, { error: range });
}

/** A share or a tension value in 0..1. */
function share(label: string) {
  const text = (iss: Issue): string =>
    iss.input === undefined
      ? `${label} is missing.`
      : `${label} must be a number between 0 and 1${got(iss)}.`;
  return z.number({ error: text }).min(0, { error: text }).max(1, { error: text });
}

function flag(label: string) {
  return z.boolean({ error: (iss) => `${label} must be true or false${got(iss)}.` });
}

export const VoiceIdSchema = z.enum(VOICE_IDS, {
  error: (iss) =>
    `Unknown voice${got(iss)}: choose one of ${listWords(
      VOICE_IDS.map((v) => `"${v}"`),
      'or',
    )}.`,
});

function voiceList(label: string) {
  return z
    .array(VoiceIdSchema, { error: (iss) => `${label} must be a list of voices${got(iss)}.` })
    .min(1, { error: `${label} must name at least one voice.` })
    .refine((voices) => new Set(voices).size === voices.length, {
      error: `${label} lists a voice twice.`,
    });
}

const SlotsPerBeat = wholeNumber(
  'Slots per beat',
  1,
  8,
  ' in the subdivision (2 = eighths, 4 = sixteenths)',
);

export const MeterSchema = z.strictObject(
  {
    beats: wholeNumber('The number of beats in a bar', 1, 15),
    grouping: z
      .array(wholeNumber('A beat group', 1, 4, ' beats'), {
        error: 'The grouping must be a list of beat counts, e.g. [2, 2, 3] for 7/8.',
      })
      .min(1, { error: 'The grouping needs at least one group.' })
      .optional(),
    unit: z.union([z.literal(2), z.literal(4), z.literal(8), z.literal(16)], {
      error: (iss) =>
        `The beat unit (bottom number of the meter) must be 2, 4, 8 or 16${got(iss)}.`,
    }),
  },
  { error: 'The meter must give beats and a unit, e.g. { "beats": 4, "unit": 4 }.' },
);

export const SubdivisionSchema = z.union(
  [
    SlotsPerBeat,
    z
      .array(SlotsPerBeat, { error: 'The subdivision must be a number or a list of numbers.' })
      .min(1, { error: 'The subdivision list needs one entry per beat.' }),
  ],
  {
    error: (iss) =>
      `The subdivision must be 1–8 slots per beat (2 eighths, 3 triplets, 4 sixteenths, 5 quintuplets, 6 sextuplets, 7 septuplets, 8 thirty-seconds), or one such number per beat${got(iss)}.`,
  },
);

export const OstinatoSchema = z.strictObject({
  voice: VoiceIdSchema,
  slots: z
    .array(wholeNumber('An ostinato slot', 0, 7), {
      error: 'The ostinato slots must be a list of positions inside the beat, e.g. [0, 2].',
    })
    .min(1, { error: 'The ostinato needs at least one slot per beat.' })
    .refine((slots) => new Set(slots).size === slots.length, {
      error: 'The ostinato lists a slot twice.',
    }),
  dynamic: z.enum(['ghost', 'normal', 'accent']).default('normal'),
});

const Dynamic = z.enum(['ghost', 'normal', 'accent'], {
  error: (iss) => `A dynamic must be "ghost", "normal" or "accent"${got(iss)}.`,
});

export const BackbeatRuleSchema = z.strictObject({
  kind: z.literal('backbeat'),
  voice: VoiceIdSchema,
  beats: z
    .array(wholeNumber('A backbeat beat', 1, 15), { error: 'Backbeat beats must be a list.' })
    .min(1, { error: 'The backbeat needs at least one beat, e.g. [2, 4].' }),
  shift: wholeNumber('The backbeat shift', -32, 32, ' slots').default(0),
  bars: z
    .array(wholeNumber('A backbeat bar', 1, 64))
    .min(1)
    .optional(),
  dynamic: Dynamic.default('accent'),
});

export const AvoidDownbeatRuleSchema = z.strictObject({
  kind: z.literal('avoidDownbeat'),
  voice: VoiceIdSchema,
  resolveEvery: wholeNumber('resolveEvery', 0, 64, ' bars (0 = never resolve)').default(0),
  anticipate: flag('anticipate').default(false),
  landing: z
    .enum(['start', 'end'], {
      error: (iss) =>
        `landing must be "start" (land on bar 1 of each cycle) or "end" (land on its last bar)${got(iss)}.`,
    })
    .default('start'),
});

export const FillHolesRuleSchema = z
  .strictObject({
    kind: z.literal('fillHoles'),
    voices: voiceList('The fillHoles voices'),
    ghost: share('The ghost-note share').default(0),
    accent: share('The accent share').default(0),
  })
  .refine((rule) => rule.ghost + rule.accent <= 1, {
    error: 'The ghost-note and accent shares together must not exceed 1.',
    path: ['ghost'],
  });

export const LinearRuleSchema = z.strictObject({
  kind: z.literal('linear'),
  maxOverlaps: wholeNumber('maxOverlaps', 0, 120, ' instants per bar').default(0),
});

export const PolyrhythmRuleSchema = z.strictObject({
  kind: z.literal('polyrhythm'),
  voices: voiceList('The polyrhythm voices'),
  against: wholeNumber('The polyrhythm "against" count', 1, 32, ' hits'),
  span: wholeNumber('The polyrhythm span', 1, 64, ' beats').optional(),
});

export const EuclidRuleSchema = z
  .strictObject({
    kind: z.literal('euclid'),
    voice: VoiceIdSchema,
    pulses: wholeNumber('The Euclidean pulses', 1, 64),
    steps: wholeNumber('The Euclidean steps', 1, 64),
    rotation: wholeNumber('The Euclidean rotation', 0, 63, ' steps').default(0),
    span: wholeNumber('The Euclidean span', 1, 64, ' beats').optional(),
  })
  .refine((rule) => rule.pulses <= rule.steps, {
    error: 'A Euclidean rhythm cannot have more pulses than steps.',
    path: ['pulses'],
  });

export const TensionRuleSchema = z.strictObject({
  kind: z.literal('tension'),
  curve: z
    .array(share('A tension target'), { error: 'The tension curve must be a list of numbers.' })
    .min(1, { error: 'The tension curve needs at least one value.' })
    .max(64, { error: 'The tension curve may hold at most 64 values (one per bar).' }),
});

export const PhraseRuleSchema = z.strictObject({
  kind: z.literal('phrase'),
  every: wholeNumber('The phrase length', 2, 16, ' bars'),
  fillBeats: wholeNumber('The fill length', 1, 15, ' beats').optional(),
  voices: voiceList('The phrase fill voices').optional(),
  crash: flag('crash').default(true),
});

const RULE_KINDS = [
  'backbeat',
  'avoidDownbeat',
  'phrase',
  'fillHoles',
  'linear',
  'polyrhythm',
  'euclid',
  'tension',
] as const;

export const RuleSchema = z.discriminatedUnion(
  'kind',
  [
    BackbeatRuleSchema,
    AvoidDownbeatRuleSchema,
    FillHolesRuleSchema,
    LinearRuleSchema,
    PolyrhythmRuleSchema,
    EuclidRuleSchema,
    TensionRuleSchema,
    PhraseRuleSchema,
  ],
  {
    error: (iss) =>
      `Unknown rule kind${got({ input: (iss.input as { kind?: unknown } | undefined)?.kind })}: use one of ${listWords(
        RULE_KINDS.map((k) => `"${k}"`),
        'or',
      )}.`,
  },
);

/** A further time-keeping layer: its voice plays these slots of the listed beats, every bar. */
export const LayerSchema = z.strictObject({
  voice: VoiceIdSchema,
  slots: z
    .array(wholeNumber('A layer slot', 0, 7), {
      error: "A layer's slots must be a list of positions inside the beat, e.g. [0].",
    })
    .min(1, { error: 'A layer needs at least one slot per beat.' })
    .refine((slots) => new Set(slots).size === slots.length, {
      error: 'A layer lists a slot twice.',
    }),
  beats: z
    .array(wholeNumber('A layer beat', 1, 15), { error: "A layer's beats must be a list." })
    .min(1, { error: 'A layer needs at least one beat, e.g. [2, 4].' })
    .optional(),
  dynamic: z.enum(['ghost', 'normal', 'accent']).default('normal'),
});

export const VOICE_ROLES = ['time', 'anchor', 'embellishment', 'colour'] as const;
export type VoiceRole = (typeof VOICE_ROLES)[number];

const RoleSchema = z.enum(VOICE_ROLES, {
  error: (iss) => `A voice role must be "time", "anchor", "embellishment" or "colour"${got(iss)}.`,
});

export const StickingSchema = z.strictObject({
  lead: z
    .enum(['right', 'left', 'alternate'], {
      error: (iss) => `The sticking lead must be "right", "left" or "alternate"${got(iss)}.`,
    })
    .optional(),
  doubles: flag('doubles').default(false),
});

export const SwingSchema = z.strictObject({
  unit: z.union([z.literal(8), z.literal(16)], {
    error: (iss) => `Swing applies to eighth (8) or sixteenth (16) pairs${got(iss)}.`,
  }),
  ratio: z
    .number({ error: 'The swing ratio must be a number between 0.5 and 0.75.' })
    .min(0.5, { error: 'The swing ratio must be between 0.5 (straight) and 0.75.' })
    .max(0.75, { error: 'The swing ratio must be between 0.5 (straight) and 0.75.' }),
});

/** The card as written, before the defaults that depend on other fields are filled in. */
export const RawRuleCardSchema = z.strictObject(
  {
    meter: MeterSchema.default({ beats: 4, unit: 4 }),
    bars: wholeNumber('The number of bars', 1, 64).default(4),
    subdivision: SubdivisionSchema.default(4),
    tempo: wholeNumber('Tempo', 20, 320, ' beats per minute').default(90),
    voices: voiceList('The voices').default(['kick', 'snare', 'hihat']),
    ostinato: OstinatoSchema.optional(),
    layers: z.array(LayerSchema, { error: 'The layers must be a list.' }).max(4).default([]),
    roles: z
      .partialRecord(VoiceIdSchema, RoleSchema, {
        error: 'The roles must map voices to roles, e.g. { "kick": "anchor" }.',
      })
      .optional(),
    fillStep: z
      .partialRecord(VoiceIdSchema, wholeNumber('A fill step', 1, 8, ' slots'), {
        error: 'The fill steps must map voices to a number of slots, e.g. { "kick": 2 }.',
      })
      .optional(),
    hand: z
      .enum(['right', 'left'], {
        error: (iss) => `The player's hand must be "right" or "left"${got(iss)}.`,
      })
      .default('right'),
    sticking: StickingSchema.optional(),
    swing: SwingSchema.optional(),
    measure: z
      .enum(['lhl', 'witek'], {
        error: (iss) => `The tension measure must be "lhl" or "witek"${got(iss)}.`,
      })
      .default('lhl'),
    density: share('The density').default(0.3),
    rules: z.array(RuleSchema, { error: 'The rules must be a list.' }).default([]),
  },
  { error: 'A rule card must be an object with meter, bars, subdivision, tempo and voices.' },
);

export type RawRuleCard = z.infer<typeof RawRuleCardSchema>;
type RawRule = RawRuleCard['rules'][number];
type WithSpan<R> = R extends unknown
  ? 'span' extends keyof R
    ? Omit<R, 'span'> & { span: number }
    : 'fillBeats' extends keyof R
      ? Omit<R, 'fillBeats' | 'voices'> & { fillBeats: number; voices: VoiceId[] }
      : R
  : never;

/** A normalised rule: spans filled in (one bar when the card left them out). */
export type Rule = WithSpan<RawRule>;
export type RuleKind = Rule['kind'];
export type BackbeatRule = Extract<Rule, { kind: 'backbeat' }>;
export type AvoidDownbeatRule = Extract<Rule, { kind: 'avoidDownbeat' }>;
export type FillHolesRule = Extract<Rule, { kind: 'fillHoles' }>;
export type LinearRule = Extract<Rule, { kind: 'linear' }>;
export type PolyrhythmRule = Extract<Rule, { kind: 'polyrhythm' }>;
export type EuclidRule = Extract<Rule, { kind: 'euclid' }>;
export type TensionRule = Extract<Rule, { kind: 'tension' }>;
export type PhraseRule = Extract<Rule, { kind: 'phrase' }>;
export type Layer = z.infer<typeof LayerSchema>;
export type Sticking = z.infer<typeof StickingSchema>;
export type Swing = z.infer<typeof SwingSchema>;
export type Ostinato = z.infer<typeof OstinatoSchema>;
export type Meter = z.infer<typeof MeterSchema>;

/** A validated rule card with every default filled in: what `generateDrill` takes. */
export type RuleCard = Omit<RawRuleCard, 'rules' | 'roles' | 'sticking' | 'fillStep'> & {
  readonly rules: readonly Rule[];
  readonly sticking: { readonly lead: 'right' | 'left' | 'alternate'; readonly doubles: boolean };
  /** Every card voice's role (defaults filled in by `canonicalCard`). */
  readonly roles: Readonly<Partial<Record<VoiceId, VoiceRole>>>;
  /** Fills of these voices only on slots that are multiples of the step (2 = eighths in sixteenths). */
  readonly fillStep?: Readonly<Partial<Record<VoiceId, number>>>;
};

/** Rule kinds in the order the drill contract lists them (also the order of their sources). */
export { RULE_KINDS };
