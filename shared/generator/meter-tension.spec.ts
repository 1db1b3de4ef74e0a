import { describe, expect, it } from 'vitest';
import { checkDrill, generateDrill, measureTension, parseRuleCard } from './index';

/** The card's grouping reaches the tension the generator aims at and the checker verifies. */
describe('tension of grouped meters in drills', () => {
  const card = (grouping?: number[]) =>
    parseRuleCard({
      meter: { beats: 7, unit: 8, ...(grouping ? { grouping } : {}) },
      subdivision: 1,
      bars: 4,
      voices: ['kick', 'snare', 'hihat'],
      ostinato: { voice: 'hihat', slots: [0] },
      density: 0.4,
      rules: [{ kind: 'tension', curve: [0, 1] }],
    });

  it('measures 7/8 in eighths on its 2+2+3 groups (ungrouped, seven eighths never syncopate)', () => {
    const parsed = card();
    expect(parsed.meter.grouping).toEqual([2, 2, 3]);
    const drill = generateDrill(parsed, 'seven');
    const grouping = parsed.meter.grouping;
    for (const bar of drill.bars) {
      expect(bar.tension).toBe(measureTension(bar, grouping));
      expect(measureTension(bar)).toBe(0);
    }
    expect(Math.max(...drill.bars.map((bar) => bar.tension))).toBeGreaterThan(0);
    expect(checkDrill(parsed, drill)).toEqual([]);
  });

  it('the checker measures with the card grouping: 3+2+2 tensions do not pass as 2+2+3', () => {
    // The first of a few seeds whose drill has a bar the two groupings measure differently.
    const drills = Array.from({ length: 20 }, (_, i) => generateDrill(card([3, 2, 2]), `rot-${i}`));
    const drill = drills.find((d) =>
      d.bars.some((bar) => measureTension(bar, [3, 2, 2]) !== measureTension(bar, [2, 2, 3])),
    );
    expect(drill).toBeDefined();
    expect(checkDrill(card([3, 2, 2]), drill!)).toEqual([]);
    const wrong = card([2, 2, 3]);
    expect(checkDrill(wrong, { ...drill!, card: wrong })).toContainEqual(
      expect.objectContaining({ code: 'tension' }),
    );
  });
});
