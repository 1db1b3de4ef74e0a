import { beforeAll, describe, expect, it } from 'vitest';
import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';
import { generateDrill, parseRuleCard } from '../../shared/generator/index';
import { readCard, rulesOf } from './card';
import { DRILL_CHECKS, PRESET_CHECKS } from './checks';
import { planOf } from './plan';
import { failuresOf, report, runCard, type Outcome } from './run';

/**
 * Every built-in preset at 20 seeds, through the rule oracle and the preset checks: a kick
 * on one in every landing bar, no fill in a time voice, no single hand three grid notes in a row
 * at sixteenths of 120 BPM or faster (unless the card asks for doubles), no hand crossing while
 * the other hand is free.
 */
const SEEDS = Array.from({ length: 20 }, (_, i) => `s${i}`);

let outcomes: Outcome[] = [];

beforeAll(() => {
  outcomes = BUILT_IN_PRESETS.flatMap((preset) =>
    SEEDS.map((seed) => runCard(preset.card, seed, { preset: true, label: `preset ${preset.id}` })),
  );
}, 60_000);

describe('rule oracle: presets at 20 seeds', () => {
  it('runs every preset at every seed', () => {
    expect(outcomes.length).toBe(BUILT_IN_PRESETS.length * SEEDS.length);
  });

  it('every preset parses', () => {
    expect(
      report(
        outcomes.filter((o) => o.kind === 'invalid'),
        'Presets refused by parseRuleCard',
      ),
      '',
    ).toBeNull();
  });

  it('every preset generates a drill at every seed', () => {
    const notDrills = outcomes.filter((o) => o.kind === 'refused' || o.kind === 'crashed');
    expect(report(notDrills, 'Preset runs without a drill'), '').toBeNull();
  });

  it('no preset is a card the reasoner proves impossible', () => {
    const impossible = outcomes.filter((o) => o.kind === 'drill' && o.impossible.length > 0);
    expect(report(impossible, 'Presets proved impossible'), '').toBeNull();
  });

  it.each([...DRILL_CHECKS, ...PRESET_CHECKS])('%s holds on every preset drill', (check) => {
    expect(failuresOf(outcomes, check), '').toBeNull();
  });

  // A note the preset's summary calls a ghost is played as one: where the summary says "ghost
  // notes on the snare", every note the generator adds on the snare is a ghost (common practice:
  // a ghost note is a low tap; a full-strength note where the page promised ghosts is a different
  // groove).
  it('notes the summary calls ghosts are ghosts', () => {
    const loud: string[] = [];
    for (const preset of BUILT_IN_PRESETS) {
      const named = /ghost notes? on the (\w+)/i.exec(preset.summary)?.[1]?.toLowerCase();
      if (!named) continue;
      const parsed = parseRuleCard(preset.card);
      for (const seed of SEEDS)
        for (const bar of generateDrill(parsed, seed).bars)
          for (const h of bar.hits)
            if (h.source === 'fill' && h.voice.toLowerCase() === named && h.dynamic !== 'ghost')
              loud.push(`${preset.id} ${seed} bar ${bar.bar} ${h.beat}.${h.slot} ${h.dynamic}`);
    }
    expect(loud, 'notes the summary calls ghosts, played louder').toEqual([]);
  });

  // A snare note the generator adds between the time's strokes is a ghost or a deliberate accent,
  // never a plain full stroke (common practice: between ghost notes a full-strength snare reads as
  // a stray backbeat; the embellishment is either a tap or a marked accent).
  it('snare fill notes are ghosts or accents', () => {
    const plain: string[] = [];
    for (const preset of BUILT_IN_PRESETS) {
      const parsed = parseRuleCard(preset.card);
      for (const seed of SEEDS)
        for (const bar of generateDrill(parsed, seed).bars)
          for (const h of bar.hits)
            if (h.source === 'fill' && h.voice === 'snare' && h.dynamic === 'normal')
              plain.push(`${preset.id} ${seed} bar ${bar.bar} ${h.beat}.${h.slot}`);
    }
    expect(plain, 'snare fill notes at plain full strength').toEqual([]);
  });

  // Where the summary promises an eighth-note groove in quarter-note beats, the kick outside the
  // phrase's fill bars falls on the beat or its "and", never on an "e" or "a" (common practice: a
  // beginner's eighth-note groove keeps the bass drum on the eighths; sixteenth kicks are the next
  // step, not part of the same lesson).
  it('an eighth-note groove keeps its kick on the eighths outside the fill bars', () => {
    const busy: string[] = [];
    let grooves = 0;
    for (const preset of BUILT_IN_PRESETS) {
      if (!/eighth-note groove/i.test(preset.summary)) continue;
      const parsed = parseRuleCard(preset.card);
      if (parsed.meter.unit !== 4) continue;
      grooves++;
      const fillBars = new Set(planOf(readCard(preset.card, parsed)).fillBars);
      const sub = parsed.subdivision;
      const slotsIn = (beat: number): number => (Array.isArray(sub) ? sub[beat - 1]! : sub);
      for (const seed of SEEDS)
        for (const bar of generateDrill(parsed, seed).bars)
          for (const h of bar.hits)
            if (
              h.voice === 'kick' &&
              !fillBars.has(bar.bar) &&
              (2 * h.slot) % slotsIn(h.beat) !== 0
            )
              busy.push(`${preset.id} ${seed} bar ${bar.bar} ${h.beat}.${h.slot}`);
    }
    expect(grooves, 'presets that promise an eighth-note groove').toBeGreaterThan(0);
    expect(busy, 'kicks between the eighths of an eighth-note groove').toEqual([]);
  });

  // A card's `fillStep` (docs/engine.md, Fill steps) keeps a voice's fills on every n-th slot of
  // the beat, read here from the card as written: with kicks on the eighths only, the displaced
  // snare is the one sixteenth the ear follows (common practice: the kick of a beginner's or
  // intermediate displacement groove stays on the eighths until the snare sits).
  it('a voice with a fill step never takes a fill between its steps', () => {
    const off: string[] = [];
    const stepped: string[] = [];
    for (const preset of BUILT_IN_PRESETS) {
      const steps = (preset.card as { fillStep?: Record<string, number> }).fillStep;
      if (!steps) continue;
      stepped.push(preset.id);
      const parsed = parseRuleCard(preset.card);
      for (const seed of SEEDS)
        for (const bar of generateDrill(parsed, seed).bars)
          for (const h of bar.hits) {
            const step = steps[h.voice];
            if (h.source === 'fill' && step !== undefined && h.slot % step !== 0)
              off.push(`${preset.id} ${seed} bar ${bar.bar} ${h.beat}.${h.slot} ${h.voice}`);
          }
    }
    expect(stepped).toEqual(expect.arrayContaining(['early-backbeat', 'three-off-land-on-four']));
    expect(off, "fills between their voice's steps").toEqual([]);
  });

  // A linear groove with toms on the card moves round the kit with the hands: the sixteenths
  // between the eighths go mostly to the hands, and the toms are heard in most bars (common
  // practice: a linear groove is led by the hands, the kick placed between them; one whose
  // in-between notes fall mostly to the kick is a bass-drum exercise).
  it('a linear preset with toms plays its in-between sixteenths mostly with the hands', () => {
    const thin: string[] = [];
    let linear = 0;
    for (const preset of BUILT_IN_PRESETS) {
      const written = preset.card as { voices?: string[]; rules?: { kind: string }[] };
      const toms = (written.voices ?? []).filter((v) => v.startsWith('tom'));
      if (!written.rules?.some((r) => r.kind === 'linear') || toms.length === 0) continue;
      linear++;
      const parsed = parseRuleCard(preset.card);
      let hands = 0;
      let feet = 0;
      let tomNotes = 0;
      let bars = 0;
      for (const seed of SEEDS)
        for (const bar of generateDrill(parsed, seed).bars) {
          bars++;
          for (const h of bar.hits) {
            if (toms.includes(h.voice)) tomNotes++;
            // Odd slots of a sixteenth beat: the "e" and the "a".
            if (bar.beats[h.beat - 1] === 4 && h.slot % 2 === 1) {
              if (h.voice === 'kick' || h.voice === 'hihatFoot') feet++;
              else hands++;
            }
          }
        }
      if (hands < 2 * feet || tomNotes < 2 * bars)
        thin.push(
          `${preset.id}: hands ${hands}, feet ${feet} on "e" and "a"; ${tomNotes} toms in ${bars} bars`,
        );
    }
    expect(linear).toBeGreaterThan(0);
    expect(thin).toEqual([]);
  });

  // A phrase's fill varies with the seed where its window holds more strokes than two for each of
  // its voices (common practice: a teacher hands out more than one fill for a groove; the order
  // high to low and the pairs stay, how many pairs each drum takes may change).
  it('phrase fills vary with the seed where the window leaves room', () => {
    const same: string[] = [];
    for (const preset of BUILT_IN_PRESETS) {
      const parsed = parseRuleCard(preset.card);
      const plan = planOf(readCard(preset.card, parsed));
      const phrase = rulesOf(plan.card, 'phrase')[0];
      if (!phrase) continue;
      const perBar = plan.fillWindow.size / Math.max(1, plan.fillBars.length);
      if (perBar <= 2 * phrase.voices.length) continue;
      const fills = new Set(
        SEEDS.map((seed) =>
          JSON.stringify(
            generateDrill(parsed, seed).bars.flatMap((b) =>
              b.hits
                .filter((h) => h.source === 'phrase')
                .map((h) => `${b.bar}.${h.beat}.${h.slot}.${h.voice}`),
            ),
          ),
        ),
      );
      if (fills.size < 2) same.push(preset.id);
    }
    expect(same, 'presets whose fill is the same at every seed').toEqual([]);
  });
});
