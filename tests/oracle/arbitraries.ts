/**
 * fast-check arbitraries for rule cards, built from the drill contract and docs/engine.md (every
 * rule kind, meter grouping, layers, roles, hand and sticking, swing, measure, landing, phrase).
 * Every card they build is valid by the contract; what they leave out, and why:
 * - the grid never runs faster than 5 notes a second (tempo × slots ≤ 300 a minute), below the
 *   single-hand rate a drummer can sustain (common practice), so a rate limit never decides;
 * - the crash only ever plays its colour role (no rule, layer or fill list names it), and fill
 *   lists name no time voice or figure (euclid/polyrhythm) voice: docs/engine.md does not say
 *   which wins there;
 * - a tension curve is varied only when the notes the rules fix repeat bar for bar (then a drill
 *   whose bars all measure alike keeps any rank order, so the card is feasible); otherwise it is
 *   flat (every bar the same target: no order to keep), because the oracle does not reason
 *   about which tensions a free fill can reach; on the polyphonic (Witek) measure, whose reach
 *   the oracle does not work out (it only re-measures each bar, witek.ts), it is always flat.
 */
import fc from 'fast-check';
import { ALL_VOICES, isHand, readCard, type Voice } from './card';
import { Grid, gcd } from './grid';
import { key, planOf } from './plan';

type Json = Record<string, unknown>;

interface Frame {
  beats: number;
  bars: number;
  subs: number[];
  subdivision: number | number[];
  voices: Voice[];
}

const range = (from: number, to: number): number[] =>
  Array.from({ length: to - from + 1 }, (_, i) => from + i);

/** Counts k (1..32) of even points over `span` beats whose every point lands on a slot, for every
 * alignment of the cycle with the bar. */
function landingCounts(f: Frame, span: number): number[] {
  const grid = new Grid(f.subs, 1);
  const period = (span * f.beats) / gcd(span, f.beats);
  return range(1, 32).filter((k) => {
    for (let start = 0; start < period; start += span)
      for (let i = 0; i < k; i++) if (grid.atBeats(start * k + i * span, k) === null) return false;
    return true;
  });
}

/** The rule with its span, or without one (then it is one bar). */
const withSpan = (rule: Json, span: number | undefined): Json =>
  span === undefined ? rule : { ...rule, span };

const optional = <T>(arb: fc.Arbitrary<T>): fc.Arbitrary<T | undefined> =>
  fc.option(arb, { nil: undefined, freq: 2 });

const subsetOf = <T>(items: readonly T[], max = items.length): fc.Arbitrary<T[]> =>
  fc.shuffledSubarray([...items], {
    minLength: 1,
    maxLength: Math.max(1, Math.min(max, items.length)),
  });

/** A grouping of `beats` into groups of 1–4 beats (docs/engine.md, "Meter grouping"). */
function groupingArb(beats: number): fc.Arbitrary<number[]> {
  return fc
    .array(fc.integer({ min: 1, max: 4 }), { minLength: beats, maxLength: beats })
    .map((sizes) => {
      const groups: number[] = [];
      let left = beats;
      for (const size of sizes) {
        if (left === 0) break;
        const g = Math.min(size, left);
        groups.push(g);
        left -= g;
      }
      return groups;
    });
}

const frameArb: fc.Arbitrary<Frame> = fc
  .record({
    beats: fc.oneof(
      { weight: 5, arbitrary: fc.integer({ min: 1, max: 7 }) },
      { weight: 1, arbitrary: fc.integer({ min: 8, max: 15 }) },
    ),
    bars: fc.integer({ min: 1, max: 8 }),
    voices: fc.shuffledSubarray([...ALL_VOICES], { minLength: 1, maxLength: 6 }),
    uniform: fc.boolean(),
  })
  .chain((f) =>
    (f.uniform
      ? fc.integer({ min: 1, max: 8 }).map((s) => s as number | number[])
      : fc.array(fc.integer({ min: 1, max: 8 }), { minLength: f.beats, maxLength: f.beats })
    ).map((subdivision) => ({
      beats: f.beats,
      bars: f.bars,
      voices: f.voices,
      subdivision,
      subs:
        typeof subdivision === 'number' ? Array<number>(f.beats).fill(subdivision) : subdivision,
    })),
  );

function ruleArb(f: Frame): fc.Arbitrary<Json> {
  const ruleVoices = f.voices.filter((v) => v !== 'crash');
  const beatList = range(1, f.beats);
  // A span left out is one bar (the drill contract).
  const spanArb = optional(fc.integer({ min: 1, max: 8 }));
  const kinds: fc.Arbitrary<Json>[] = [
    fc.record({ kind: fc.constant('linear'), maxOverlaps: fc.integer({ min: 0, max: 4 }) }),
    fc.record({
      kind: fc.constant('tension'),
      curve: fc.array(
        fc.integer({ min: 0, max: 10 }).map((n) => n / 10),
        { minLength: 1, maxLength: 4 },
      ),
    }),
  ];
  if (ruleVoices.length > 0) {
    const voice = fc.constantFrom(...ruleVoices);
    kinds.push(
      fc.record(
        {
          kind: fc.constant('backbeat'),
          voice,
          beats: subsetOf(beatList, 3),
          shift: fc.integer({ min: -8, max: 8 }),
          bars: subsetOf(range(1, f.bars)),
          dynamic: fc.constantFrom('ghost', 'normal', 'accent'),
        },
        { requiredKeys: ['kind', 'voice', 'beats'] },
      ),
      fc
        .record(
          {
            kind: fc.constant('avoidDownbeat'),
            voice,
            resolveEvery: fc.integer({ min: 0, max: 5 }),
            anticipate: fc.boolean(),
            landing: fc.constantFrom('start', 'end'),
          },
          { requiredKeys: ['kind', 'voice'] },
        )
        // A landing at the end of a cycle needs a cycle: parseRuleCard refuses "end" with
        // resolveEvery 0 (never land), which is fair.
        .map((r) =>
          r['landing'] === 'end' && !r['resolveEvery'] ? { ...r, landing: 'start' } : r,
        ),
      fc.record(
        {
          kind: fc.constant('fillHoles'),
          voices: subsetOf(ruleVoices, 3),
          ghost: fc.constantFrom(0, 0.3, 0.5),
          accent: fc.constantFrom(0, 0.2, 0.5),
        },
        { requiredKeys: ['kind', 'voices'] },
      ),
      spanArb.chain((s) =>
        fc
          .record(
            {
              kind: fc.constant('polyrhythm'),
              voices: subsetOf(ruleVoices, 2),
              against: fc.constantFrom(...landingCounts(f, s ?? f.beats)),
            },
            { requiredKeys: ['kind', 'voices', 'against'] },
          )
          .map((r) => withSpan(r, s)),
      ),
      spanArb.chain((s) =>
        fc.constantFrom(...landingCounts(f, s ?? f.beats)).chain((steps) =>
          fc
            .record(
              {
                kind: fc.constant('euclid'),
                voice,
                pulses: fc.integer({ min: 1, max: steps }),
                steps: fc.constant(steps),
                rotation: fc.integer({ min: 0, max: steps + 3 }),
              },
              { requiredKeys: ['kind', 'voice', 'pulses', 'steps'] },
            )
            .map((r) => withSpan(r, s)),
        ),
      ),
    );
  }
  const fillers = f.voices.filter((v) =>
    ['snare', 'rim', 'tomHigh', 'tomMid', 'tomFloor'].includes(v),
  );
  const everies = range(2, 16).filter((n) => f.bars % n === 0);
  if (
    f.voices.some((v) => ['snare', 'tomHigh', 'tomMid', 'tomFloor'].includes(v)) &&
    everies.length
  )
    kinds.push(
      fc.record(
        {
          kind: fc.constant('phrase'),
          every: fc.constantFrom(...everies),
          fillBeats: fc.integer({ min: 1, max: f.beats }),
          voices: subsetOf(fillers),
          crash: fc.boolean(),
        },
        { requiredKeys: ['kind', 'every'] },
      ),
    );
  return fc.oneof(...kinds);
}

/** Swing needs each beat split evenly into the swung pairs (docs/engine.md, "Swing"). */
function swingArb(unit: number, subs: readonly number[]): fc.Arbitrary<Json | undefined> {
  const fits = [8, 16].filter((s) => s / unit >= 2 && subs.every((n) => n % (s / unit) === 0));
  if (fits.length === 0) return fc.constant(undefined);
  return optional(
    fc.record({
      unit: fc.constantFrom(...fits),
      ratio: fc.constantFrom(0.5, 0.6, 2 / 3, 0.75),
    }),
  );
}

/** The raw cards. */
export const cardArb: fc.Arbitrary<Json> = frameArb.chain((f) => {
  const fewest = Math.min(...f.subs);
  const timeVoices = f.voices.filter((v) => v !== 'crash');
  const ostinatoArb = optional(
    timeVoices.length
      ? fc.record(
          {
            voice: fc.constantFrom(...timeVoices),
            slots: subsetOf(range(0, fewest - 1)),
            dynamic: fc.constantFrom('ghost', 'normal', 'accent'),
          },
          { requiredKeys: ['voice', 'slots'] },
        )
      : fc.constant(undefined),
  );
  return fc
    .record({
      unit: fc.constantFrom(2, 4, 8, 16),
      grouping: optional(groupingArb(f.beats)),
      tempoShare: fc.integer({ min: 0, max: 1000 }),
      hand: optional(fc.constantFrom('right', 'left')),
      sticking: optional(
        fc.record(
          { lead: fc.constantFrom('right', 'left', 'alternate'), doubles: fc.boolean() },
          { requiredKeys: [] },
        ),
      ),
      measure: optional(fc.constantFrom('lhl', 'witek')),
      density: fc.integer({ min: 0, max: 10 }).map((n) => n / 10),
      ostinato: ostinatoArb,
      layerPicks: fc.array(
        fc.record({
          voice: fc.constantFrom(...f.voices),
          beats: optional(subsetOf(range(1, f.beats))),
          slot: fc.integer({ min: 0, max: 7 }),
          dynamic: optional(fc.constantFrom('ghost', 'normal', 'accent')),
        }),
        { maxLength: 2 },
      ),
      rolePicks: fc.array(
        fc.record({
          voice: fc.constantFrom(...f.voices),
          role: fc.constantFrom('time', 'embellishment', 'anchor'),
        }),
        { maxLength: 2 },
      ),
      rules: fc.array(ruleArb(f), { maxLength: 4 }),
    })
    .chain((p) =>
      swingArb(p.unit, f.subs).map((swing) => {
        // tempo × slots ≤ 300 a minute in the fastest beat
        const fastest = Math.max(...f.subs);
        const top = Math.max(20, Math.min(320, Math.floor(300 / fastest)));
        const tempo = 20 + Math.floor(((top - 20) * p.tempoShare) / 1000);
        return assemble(f, { ...p, tempo, swing });
      }),
    );
});

interface Picks {
  unit: number;
  grouping: number[] | undefined;
  tempo: number;
  hand: string | undefined;
  sticking: Json | undefined;
  swing: Json | undefined;
  measure: string | undefined;
  density: number;
  ostinato: Json | undefined;
  layerPicks: {
    voice: Voice;
    beats: number[] | undefined;
    slot: number;
    dynamic: string | undefined;
  }[];
  rolePicks: { voice: Voice; role: string }[];
  rules: Json[];
}

function assemble(f: Frame, p: Picks): Json {
  const card: Json = {
    meter: { beats: f.beats, unit: p.unit, ...(p.grouping ? { grouping: p.grouping } : {}) },
    bars: f.bars,
    subdivision: f.subdivision,
    tempo: p.tempo,
    voices: f.voices,
    density: p.density,
  };
  const ostinatoVoice = p.ostinato?.['voice'] as Voice | undefined;
  if (p.ostinato) card['ostinato'] = p.ostinato;

  // Layers: voices other than the ostinato's and each other's, never the crash.
  const layers: Json[] = [];
  const taken = new Set<Voice>(ostinatoVoice ? [ostinatoVoice] : []);
  for (const l of p.layerPicks) {
    if (taken.has(l.voice) || l.voice === 'crash') continue;
    taken.add(l.voice);
    const beats = l.beats ?? range(1, f.beats);
    const fewest = Math.min(...beats.map((b) => f.subs[b - 1]!));
    layers.push({
      voice: l.voice,
      slots: [l.slot % fewest],
      ...(l.beats ? { beats: l.beats } : {}),
      ...(l.dynamic ? { dynamic: l.dynamic } : {}),
    });
  }
  if (layers.length) card['layers'] = layers;

  // Roles: a few overrides, never of the crash, anchor only for the kick.
  const roles: Json = {};
  for (const r of p.rolePicks) {
    if (r.voice === 'crash' || taken.has(r.voice)) continue;
    if (r.role === 'anchor' && r.voice !== 'kick') continue;
    roles[r.voice] = r.role;
  }
  if (Object.keys(roles).length) card['roles'] = roles;
  if (p.hand) card['hand'] = p.hand;
  if (p.sticking) card['sticking'] = p.sticking;
  if (p.swing) card['swing'] = p.swing;
  if (p.measure) card['measure'] = p.measure;

  // At most one tension and one phrase rule.
  let rules = p.rules.filter(
    (r, i) =>
      (r['kind'] !== 'tension' && r['kind'] !== 'phrase') ||
      p.rules.findIndex((x) => x['kind'] === r['kind']) === i,
  );
  card['rules'] = rules;

  // Fill lists name no time voice and no figure voice (see the header).
  const provisional = readCard(card, card);
  const figure = new Set<string>();
  for (const r of provisional.rules) {
    if (r.kind === 'euclid') figure.add(r.voice);
    if (r.kind === 'polyrhythm') r.voices.forEach((v) => figure.add(v));
  }
  const fillable = (v: Voice): boolean =>
    provisional.roles.get(v) !== 'time' && !figure.has(v) && v !== 'crash';
  rules = rules
    .map((r) => {
      if (r['kind'] === 'fillHoles')
        return { ...r, voices: (r['voices'] as Voice[]).filter(fillable) };
      if (r['kind'] === 'phrase' && r['voices'])
        return { ...r, voices: (r['voices'] as Voice[]).filter((v) => fillable(v) && isHand(v)) };
      return r;
    })
    .filter((r) => !(r['kind'] === 'fillHoles' && (r['voices'] as Voice[]).length === 0))
    .map((r) => {
      if (r['kind'] === 'phrase' && (r['voices'] as Voice[] | undefined)?.length === 0) {
        const { voices: _dropped, ...rest } = r;
        return rest;
      }
      return r;
    });
  // A phrase with default voices needs one of them that is not a time voice.
  rules = rules.filter(
    (r) =>
      r['kind'] !== 'phrase' ||
      r['voices'] !== undefined ||
      ['snare', 'tomHigh', 'tomMid', 'tomFloor'].some(
        (v) => f.voices.includes(v as Voice) && fillable(v as Voice),
      ),
  );
  card['rules'] = rules;

  // Flatten the tension curve unless the fixed notes repeat bar for bar.
  const tension = rules.find((r) => r['kind'] === 'tension');
  // The oracle reasons about Longuet-Higgins & Lee bars only (feasibility.ts): on the polyphonic
  // measure a varied curve stays flat.
  if (tension && (!repeatsEveryBar(card) || card['measure'] === 'witek')) {
    const curve = tension['curve'] as number[];
    tension['curve'] = curve.map(() => curve[0]!);
  }
  return card;
}

/** True when the notes the card fixes (and the downbeats it keeps free) are alike in every bar,
 * and nothing else (a phrase, a colour crash) sets one bar apart. */
function repeatsEveryBar(raw: Json): boolean {
  const card = readCard(raw, raw);
  if (card.rules.some((r) => r.kind === 'phrase')) return false;
  if (card.voices.some((v) => card.roles.get(v) === 'colour')) return false;
  const plan = planOf(card);
  const perBar = (bar: number): string => {
    const inBar = (i: number): boolean => plan.grid.barOf(i) === bar;
    const offset = (i: number): number => i - plan.grid.downbeat(bar);
    return [
      ...plan.wants.filter((w) => inBar(w.index)).map((w) => `+${key(w.voice, offset(w.index))}`),
      ...plan.silent.filter((s) => inBar(s.index)).map((s) => `-${key(s.voice, offset(s.index))}`),
    ]
      .sort()
      .join(' ');
  };
  const first = perBar(1);
  return range(2, card.bars).every((bar) => perBar(bar) === first) && plan.offGrid.length === 0;
}
