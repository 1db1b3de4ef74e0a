import { describe, expect, it } from 'vitest';
import { generateDrill, parseRuleCard, type Drill } from '../../generator/index';
import { BUILT_IN_PRESETS, findBuiltInPreset } from '../../generator/presets/index';
import { drillToMidi } from '../midi-export';
import { barsOnGrid } from './import-groove';
import { importMidiGroove } from './index';

/** A bar's hits as exact places: beat, the slot as a reduced fraction of the beat, voice, dynamic. */
function places(drill: Pick<Drill, 'bars'>): string[][] {
  const gcd = (a: number, b: number): number => (b === 0 ? a : gcd(b, a % b));
  return drill.bars.map((bar) =>
    bar.hits
      .map((h) => {
        const n = bar.beats[h.beat - 1]!;
        const g = gcd(h.slot, n);
        return `${h.beat} ${h.slot / g}/${n / g} ${h.voice} ${h.dynamic}`;
      })
      .sort(),
  );
}

function roundTrip(presetId: string, seed: string) {
  const card = parseRuleCard(findBuiltInPreset(presetId)!.card);
  const drill = generateDrill(card, seed);
  const back = importMidiGroove(drillToMidi(drill, presetId));
  return { drill, back };
}

describe('MIDI round trip: export a drill, import it, get the same hits back', () => {
  it.each([
    ['quintuplets-hihat-1-3-5', 'quintuplets'],
    ['four-over-three', '4:3'],
    ['six-eight-groove', '6/8'],
  ])('%s (%s)', (presetId) => {
    for (const seed of ['lesson-1', 'lesson-2', 'lesson-3']) {
      const { drill, back } = roundTrip(presetId, seed);
      // The drill really holds what the case names.
      if (presetId.startsWith('quintuplets')) {
        expect(back.drill.bars.some((bar) => bar.beats.includes(5))).toBe(true);
      } else if (presetId === 'four-over-three') {
        expect(drill.card.rules.some((r) => r.kind === 'polyrhythm' && r.against === 4)).toBe(true);
      } else {
        expect(back.card.meter).toMatchObject({ beats: 6, unit: 8 });
      }
      expect(back.drill.bars).toHaveLength(drill.bars.length);
      expect(places(back.drill)).toEqual(places(drill));
      expect(back.card.meter).toMatchObject({
        beats: drill.card.meter.beats,
        unit: drill.card.meter.unit,
      });
      expect(back.card.tempo).toBe(drill.card.tempo);
      expect(back.residuals.every((r) => r.ms < 0.01)).toBe(true);
      // The card must take the groove's own bars pinned (meter-tempo.spec.ts); where the curve
      // measured on the bars' own grids cannot hold on the card's grid (4:3 at one seed), the
      // card leaves the curve out and says so. Nothing else is worth a warning here.
      expect(
        back.warnings.filter((w) => !/leaves out the tension curve:/.test(w)),
        seed,
      ).toEqual([]);
      const own = barsOnGrid(back.drill.bars, back.card);
      expect(() => generateDrill(back.card, 'pinned', { keep: own! })).not.toThrow();
    }
  });

  it('every built-in preset comes back hit for hit, with a card the engine generates from', () => {
    for (const preset of BUILT_IN_PRESETS) {
      const { drill, back } = roundTrip(preset.id, 'round-trip');
      expect(places(back.drill), preset.id).toEqual(places(drill));
      expect(() => generateDrill(parseRuleCard(back.card), 'variation'), preset.id).not.toThrow();
    }
  });
});
