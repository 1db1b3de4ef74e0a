import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { GOLDEN_CASES } from '../golden/cases';
import { DRILL_CHECKS, PRESET_CHECKS, type DrillLike } from './checks';
import { checkStored, failuresOf, report, type Outcome } from './run';

/**
 * Every stored golden drill, read as it is on disk, through the rule oracle (and, for the
 * presets' goldens, the issue's preset checks). The card checked against is the card as written
 * in tests/golden/cases.ts, not the engine's normalised copy.
 */
const dir = join(dirname(fileURLToPath(import.meta.url)), '..', 'golden', 'drills');

const outcomes: Outcome[] = GOLDEN_CASES.map((c) => {
  const drill = JSON.parse(readFileSync(join(dir, `${c.name}.json`), 'utf8')) as DrillLike;
  return checkStored(c.card, drill, {
    preset: c.name.startsWith('preset-'),
    label: `golden ${c.name}`,
  });
});
const presetOutcomes = outcomes.filter((o) => o.label?.startsWith('golden preset-'));

describe('rule oracle: golden drills', () => {
  it('reads every golden drill', () => {
    expect(outcomes.length).toBe(GOLDEN_CASES.length);
  });

  it('no golden drill is for a card the reasoner proves impossible', () => {
    const impossible = outcomes.filter((o) => o.kind === 'drill' && o.impossible.length > 0);
    expect(report(impossible, 'Golden drills for cards proved impossible'), '').toBeNull();
  });

  it.each([...DRILL_CHECKS])('%s holds on every golden drill', (check) => {
    expect(failuresOf(outcomes, check), '').toBeNull();
  });

  it.each(PRESET_CHECKS)('%s holds on every preset golden drill', (check) => {
    expect(failuresOf(presetOutcomes, check), '').toBeNull();
  });
});
