import fc from 'fast-check';
import { beforeAll, describe, expect, it } from 'vitest';
import { cardArb } from './arbitraries';
import { DRILL_CHECKS } from './checks';
import { failuresOf, report, runCard, type Outcome } from './run';

/**
 * The rule oracle over random cards × seeds. The cards and seeds come from a fixed fast-check
 * seed (the same sample on every run); FC_RUNS sets how many, as in the engine's property tests.
 */
const NUM_RUNS = Number(process.env['FC_RUNS'] ?? 1000);
const FC_SEED = 20_050_731;

let outcomes: Outcome[] = [];

beforeAll(() => {
  const samples = fc.sample(fc.tuple(cardArb, fc.string({ maxLength: 12 })), {
    seed: FC_SEED,
    numRuns: NUM_RUNS,
  });
  outcomes = samples.map(([card, seed]) => runCard(card, seed));
}, 120_000);

const of = (kind: Outcome['kind']): Outcome[] => outcomes.filter((o) => o.kind === kind);

describe('rule oracle: random cards', () => {
  it('every card built from the contract parses', () => {
    expect(report(of('invalid'), 'Valid cards refused by parseRuleCard'), '').toBeNull();
  });

  it('the engine throws nothing but RuleConflictError', () => {
    expect(report(of('crashed'), 'Engine errors other than RuleConflictError'), '').toBeNull();
  });

  it('every refusal is explained by the independent feasibility reasoner', () => {
    const unexplained = outcomes.filter((o) => o.kind === 'refused' && o.reasons.length === 0);
    expect(report(unexplained, 'Refusals the oracle cannot explain'), '').toBeNull();
  });

  it('no drill comes back for a card the reasoner proves impossible', () => {
    const contradictions = outcomes.filter((o) => o.kind === 'drill' && o.impossible.length > 0);
    expect(report(contradictions, 'Drills for cards proved impossible'), '').toBeNull();
  });

  it('checks at least half of the runs on a drill (the sample is not mostly refusals)', () => {
    expect(of('drill').length).toBeGreaterThanOrEqual(NUM_RUNS / 2);
  });

  it.each(DRILL_CHECKS)('%s holds on every drill', (check) => {
    expect(failuresOf(outcomes, check), '').toBeNull();
  });
});
