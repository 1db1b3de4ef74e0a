import { describe, expect, it } from 'vitest';
import { generateDrill, parseRuleCard, type DrillBar } from '../../shared/generator/index';
import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';
import { DRILL_CHECKS, PRESET_CHECKS, type DrillLike } from './checks';
import { checkStored, failuresOf, type Outcome } from './run';

/**
 * Drills generated around pinned bars (`generateDrill(card, seed, { keep })`), through the rule
 * oracle: every preset, a drill at one seed, then each of its bars kept in turn (and the first
 * and last together) while the rest is regenerated at another seed. The oracle's own reading of
 * the card must find every rule kept, and the kept bars must come back as they were.
 */
const outcomes: Outcome[] = [];
const unchanged: string[] = [];

for (const preset of BUILT_IN_PRESETS) {
  const card = parseRuleCard(preset.card);
  const drill = generateDrill(card, 'pin-a');
  const keeps: DrillBar[][] = drill.bars.map((bar) => [bar]);
  if (drill.bars.length > 1) keeps.push([drill.bars[0]!, drill.bars[drill.bars.length - 1]!]);
  for (const keep of keeps) {
    const again = generateDrill(card, 'pin-b', { keep });
    const label = `preset ${preset.id}, bars ${keep.map((b) => b.bar).join(' and ')} kept`;
    for (const bar of keep)
      if (JSON.stringify(again.bars[bar.bar - 1]) !== JSON.stringify(bar))
        unchanged.push(`${label}: bar ${bar.bar} changed`);
    outcomes.push(checkStored(preset.card, again as DrillLike, { preset: true, label }));
  }
}

describe('rule oracle: drills around pinned bars', () => {
  it('brings every kept bar back as it was', () => {
    expect(unchanged).toEqual([]);
  });

  it.each([...DRILL_CHECKS, ...PRESET_CHECKS])('%s holds on every drill', (check) => {
    expect(failuresOf(outcomes, check), '').toBeNull();
  });
});
