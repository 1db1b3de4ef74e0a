import { beforeAll, describe, expect, it } from 'vitest';
import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';
import { DRILL_CHECKS, PRESET_CHECKS } from './checks';
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
});
