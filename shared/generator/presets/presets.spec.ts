import { describe, expect, it } from 'vitest';
import { bjorklund } from '../rhythm/bjorklund';
import { checkDrill, type Drill, type DrillBar, generateDrill, parseRuleCard } from '../index';
import { BUILT_IN_PRESETS, type BuiltInPreset, findBuiltInPreset } from './index';

const SEEDS = ['lesson-1', 'larkspur-42', 'z'];

function drillsOf(id: string): Drill[] {
  const preset = findBuiltInPreset(id);
  if (!preset) throw new Error(`No preset ${id}`);
  const card = parseRuleCard(preset.card);
  return SEEDS.map((seed) => generateDrill(card, seed));
}

/** "beat:slot" of every hit of the voice in the bar, optionally only from one source. */
const spots = (bar: DrillBar, voice: string, source?: string): string[] =>
  bar.hits
    .filter((h) => h.voice === voice && (source === undefined || h.source === source))
    .map((h) => `${h.beat}:${h.slot}`);

const everyBar = (id: string, check: (bar: DrillBar) => void): void => {
  for (const drill of drillsOf(id)) for (const bar of drill.bars) check(bar);
};

describe('built-in presets', () => {
  it('have unique kebab-case ids, a title and a summary', () => {
    const ids = BUILT_IN_PRESETS.map((p) => p.id);
    expect(new Set(ids).size).toBe(ids.length);
    expect(ids.length).toBeGreaterThanOrEqual(11);
    for (const preset of BUILT_IN_PRESETS) {
      expect(preset.id).toMatch(/^[a-z0-9]+(-[a-z0-9]+)*$/);
      expect(preset.title.trim().length).toBeGreaterThan(0);
      expect(preset.summary.trim().length).toBeGreaterThan(20);
      expect(Object.keys(preset).sort()).toEqual(['card', 'id', 'summary', 'title']);
    }
  });

  it.each(BUILT_IN_PRESETS.map((p): [string, BuiltInPreset] => [p.id, p]))(
    '%s parses, generates reproducibly and breaks no rule',
    (_id, preset) => {
      const card = parseRuleCard(preset.card);
      for (const seed of SEEDS) {
        const drill = generateDrill(card, seed);
        expect(checkDrill(card, drill)).toEqual([]);
        expect(JSON.stringify(generateDrill(card, seed))).toBe(JSON.stringify(drill));
      }
    },
  );
});

describe('the facts each preset names', () => {
  it('kick-off-the-one: kick on beat 1 in bars 1 and 3, never in bars 2 and 4; hi-hat quarters', () => {
    everyBar('kick-off-the-one', (bar) => {
      expect(spots(bar, 'kick').includes('1:0')).toBe(bar.bar % 2 === 1);
      expect(spots(bar, 'hihat')).toEqual(['1:0', '2:0', '3:0', '4:0']);
    });
  });

  it('early-backbeat: the snare sits one sixteenth before beats 2 and 4', () => {
    everyBar('early-backbeat', (bar) => {
      expect(spots(bar, 'snare', 'backbeat')).toEqual(['1:3', '3:3']);
    });
  });

  it('late-backbeat-over-the-bar-line: beat 4 moves to the "and" of the next 1', () => {
    // The drill is a loop, so bar 1 receives the last bar's shifted snare.
    everyBar('late-backbeat-over-the-bar-line', (bar) => {
      // Written in eighths: three eighths after beat 4 is the "&" (slot 1) of the next 1.
      expect(spots(bar, 'snare', 'backbeat')).toEqual(['1:1', '2:0']);
    });
  });

  it('ride-with-foot-on-2-and-4: ride eighths, hi-hat foot with the snare on 2 and 4', () => {
    everyBar('ride-with-foot-on-2-and-4', (bar) => {
      expect(spots(bar, 'ride')).toEqual(['1:0', '1:2', '2:0', '2:2', '3:0', '3:2', '4:0', '4:2']);
      // The foot keeps time as a layer: 2 and 4 and nothing else.
      expect(spots(bar, 'hihatFoot')).toEqual(['2:0', '4:0']);
      expect(spots(bar, 'hihatFoot', 'ostinato')).toEqual(['2:0', '4:0']);
      expect(spots(bar, 'snare', 'backbeat')).toEqual(['2:0', '4:0']);
    });
  });

  it('linear-sixteenths: never two hits at one instant', () => {
    everyBar('linear-sixteenths', (bar) => {
      const instants = bar.hits.map((h) => `${h.beat}:${h.slot}`);
      expect(new Set(instants).size).toBe(instants.length);
    });
  });

  // common practice: the bass figure of Cuban dance music (kick on the last sixteenth of beats
  // 1 and 3 and on the "and" of 2 and 4) as drummers adapt it to the kick.
  it('cuban-style-bass: kick on 1a, 2&, 3a, 4& and never on the downbeat', () => {
    everyBar('cuban-style-bass', (bar) => {
      expect(spots(bar, 'kick', 'backbeat')).toEqual(['1:3', '2:2', '3:3', '4:2']);
      expect(spots(bar, 'kick')).not.toContain('1:0');
      expect(spots(bar, 'snare', 'backbeat')).toEqual(['1:2', '3:2']);
      expect(spots(bar, 'hihat')).toEqual(['1:0', '2:0', '3:0', '4:0']);
    });
  });

  it('shuffle-kick-upbeats: the kick never plays on a beat and takes the upbeat before 1 and 3', () => {
    everyBar('shuffle-kick-upbeats', (bar) => {
      expect(bar.beats).toEqual([3, 3, 3, 3]);
      expect(spots(bar, 'kick').filter((s) => s.endsWith(':0'))).toEqual([]);
      expect(spots(bar, 'kick', 'backbeat')).toEqual(['2:2', '4:2']);
    });
  });

  // Derived arithmetic (common practice for 4:3): four even notes over three beats fall at
  // i × 3/4 beats, i.e. pulses 0, 3, 6, 9 of a 12-sixteenth bar, the 4-stream of the 3:4 grid on
  // lcm(3, 4) = 12 pulses.
  // 4:3 on 12 pulses: the four-stream on pulses 0, 3, 6 and 9 (the lcm grid, derived).
  it('four-over-three: the kick plays pulses 0, 3, 6 and 9 of the 3/4 bar and nothing else', () => {
    everyBar('four-over-three', (bar) => {
      expect(bar.beats).toEqual([4, 4, 4]);
      const stream = bar.hits.filter((h) => h.source === 'polyrhythm');
      expect(stream.map((h) => (h.beat - 1) * 4 + h.slot)).toEqual([0, 3, 6, 9]);
      expect(stream.every((h) => h.voice === 'kick')).toBe(true);
      expect(spots(bar, 'kick')).toEqual(['1:0', '1:3', '2:2', '3:1']);
      expect(bar.hits.filter((h) => h.voice === 'snare').every((h) => h.dynamic === 'ghost')).toBe(
        true,
      );
    });
  });

  it.each([
    ['quintuplets-hihat-1-3-5', [0, 2, 4]],
    ['quintuplets-hihat-1-3-4', [0, 2, 3]],
  ])('%s: the hi-hat sits exactly on the mask, embellishments only in the holes', (id, mask) => {
    everyBar(id, (bar) => {
      expect(bar.beats).toEqual([5, 5, 5, 5]);
      const expected = [1, 2, 3, 4].flatMap((beat) => mask.map((slot) => `${beat}:${slot}`));
      expect(spots(bar, 'hihat')).toEqual(expected);
      expect(
        bar.hits.filter((h) => h.voice === 'hihat').every((h) => h.source === 'ostinato'),
      ).toBe(true);
      const fills = bar.hits.filter((h) => h.source === 'fill');
      expect(fills.every((h) => !mask.includes(h.slot))).toBe(true);
    });
  });

  // Source: G. T. Toussaint, "The Euclidean Algorithm Generates Traditional Musical Rhythms",
  // BRIDGES 2005: E(5,16) = x..x..x..x..x... (interval vector 3-3-3-3-4).
  it('euclidean-five-in-sixteen: the kick plays E(5,16) in every bar', () => {
    const pattern = bjorklund(5, 16).flatMap((on, i) => (on ? [i] : []));
    expect(pattern).toEqual([0, 3, 6, 9, 12]);
    everyBar('euclidean-five-in-sixteen', (bar) => {
      const kicks = bar.hits.filter((h) => h.voice === 'kick' && h.source === 'euclid');
      expect(kicks.map((h) => (h.beat - 1) * 4 + h.slot)).toEqual(pattern);
    });
  });

  it('tension-and-release: measured tension rises through bar 3 and falls in bar 4', () => {
    for (const drill of drillsOf('tension-and-release')) {
      const [a = 0, b = 0, c = 0, d = 0] = drill.bars.map((bar) => bar.tension);
      expect(d).toBeLessThan(a);
      expect(a).toBeLessThan(b);
      expect(b).toBeLessThan(c);
    }
  });
});
