import { describe, expect, it } from 'vitest';
import { barTree } from './syncopation';
import {
  bruteForceGreatest,
  greatest,
  subsetsOf,
  witek,
  witekSyncopations,
  type Cell,
  type Stream,
  weightsOf,
} from './witek';

/**
 * The oracle's Witek measure checked before it judges the engine. Source of every value: M. A. G.
 * Witek et al., "Syncopation, body-movement and pleasure in groove music", PLoS ONE 9(4), 2014,
 * Methods (syncopation index). The paper's own figure values could not be read here; the values
 * below are `derived`: worked by hand from its definition (S = Ndi − N + I, I = 2 kick against
 * snare and hi-hat, 1 snare against kick and hi-hat, 5 kick or snare against the hi-hat alone) and
 * its 4/4 sixteenth weights, as quoted by the open implementations named in witek.ts.
 */

const FOUR_FOUR = weightsOf(barTree([4, 4, 4, 4], null));

/** A bar from lines of 16 characters, one per stream: 'x' sounds. */
function bar(lines: Partial<Record<Stream, string>>): Cell[] {
  return Array.from({ length: 16 }, (_, i) => {
    const cell = new Set<Stream>();
    for (const s of ['low', 'mid', 'high'] as const) if (lines[s]?.[i] === 'x') cell.add(s);
    return cell;
  });
}

const HATS = 'x.x.x.x.x.x.x.x.';
const BACKBEAT = '....x.......x...';

describe('the oracle’s Witek polyphonic syncopation', () => {
  it('weighs a 4/4 sixteenth bar as the paper does: 0, −4, −3, −4, −2, …, −1 on beat 3', () => {
    // Witek et al. 2014, Methods (metric weights after Longuet-Higgins & Lee 1984); confirmed
    // second-hand in an open TypeScript implementation that cites the paper.
    expect(FOUR_FOUR).toEqual([0, -4, -3, -4, -2, -4, -3, -4, -1, -4, -3, -4, -2, -4, -3, -4]);
  });

  it('scores a plain eighth-note groove (kick 1 and 3, backbeat, hi-hat eighths) 0', () => {
    // derived: every note is followed by a weaker sixteenth, so no pair qualifies.
    expect(witek(FOUR_FOUR, bar({ low: 'x.......x.......', mid: BACKBEAT, high: HATS }))).toBe(0);
  });

  it('scores a kick on the "a" of 2 against the hi-hat alone on 3 as 3 + 5 = 8', () => {
    // derived: N at −4, Ndi at −1 (difference 3); kick against the hi-hat alone, I = 5.
    const b = bar({ low: 'x......x........', mid: BACKBEAT, high: HATS });
    expect(witekSyncopations(FOUR_FOUR, b)).toEqual([
      { from: 7, to: 8, kind: 'vs-hi-hat', difference: 3, instrument: 5 },
    ]);
    expect(witek(FOUR_FOUR, b)).toBe(8);
  });

  it('scores the kick against snare and hi-hat 3 + 2 = 5, the snare against kick and hi-hat 3 + 1 = 4', () => {
    // derived: the same positions, the paper's two three-stream kinds.
    expect(
      witek(FOUR_FOUR, bar({ low: '.......x........', mid: '........x.......', high: HATS })),
    ).toBe(5);
    expect(
      witek(FOUR_FOUR, bar({ low: '........x.......', mid: '.......x........', high: HATS })),
    ).toBe(4);
  });

  it('ranks the kinds as the paper weighs them: against the hi-hat > kick-snare > snare-kick', () => {
    // Witek et al. 2014: I = 5 > 2 > 1 at the same positions.
    // derived: the pair "a" of 1 → 2 scores 2 + I; the last onset (beat 2) then leaves beat 3
    // silent, a monophonic pair of 1 in all three.
    const vsHat = witek(FOUR_FOUR, bar({ low: '...x............', high: 'x...x...........' }));
    const kickSnare = witek(FOUR_FOUR, bar({ low: '...x', mid: '....x', high: 'x...x' }));
    const snareKick = witek(FOUR_FOUR, bar({ mid: '...x', low: '....x', high: 'x...x' }));
    expect([vsHat, kickSnare, snareKick]).toEqual([2 + 5 + 1, 2 + 2 + 1, 2 + 1 + 1]);
  });

  it('counts a monophonic syncopation (a note before a stronger rest) by its weight difference', () => {
    // Witek et al. 2014: (N, R) with R at least as strong as N. derived: a kick on the "a" of 1
    // and nothing after: the heaviest rest before the bar's end is beat 3 (−1), so 3; read
    // one slot ahead only (next-slot), the rest is beat 2 (−2), so 2.
    expect(witek(FOUR_FOUR, bar({ low: '...x............' }))).toBe(3);
    expect(witek(FOUR_FOUR, bar({ low: '...x............' }), 'next-slot')).toBe(2);
    // A note on the last sixteenth: nothing after the bar is heard (the bar is measured alone).
    expect(witek(FOUR_FOUR, bar({ low: '...............x' }))).toBe(0);
  });

  it('pairs an eighth-note anticipation across the silent sixteenth before the beat', () => {
    // derived: a kick on the "and" of 2 (−3), nothing on its "a", the hi-hat alone on 3 (−1):
    // 2 + 5 = 7. Read one slot ahead only, the silent "a" (−4) is weaker: 0.
    const b = bar({ low: '......x.........', high: 'x.......x.......' });
    expect(witek(FOUR_FOUR, b)).toBe(7);
    expect(witek(FOUR_FOUR, b, 'next-slot')).toBe(0);
  });

  it('does not syncopate an instrument that keeps playing into the stronger position', () => {
    // derived: sixteenth hi-hats alone, or joined by a kick on 3, stop nothing.
    expect(witek(FOUR_FOUR, bar({ high: 'xxxxxxxxxxxxxxxx' }))).toBe(0);
    expect(witek(FOUR_FOUR, bar({ low: '........x.......', high: 'xxxxxxxxxxxxxxxx' }))).toBe(0);
  });

  it('finds the exact greatest index, as trying every pattern does', () => {
    const grids: [number[], number[] | null][] = [
      [[2, 2], null],
      [[3, 3], null],
      [[2, 2, 2], null],
      [
        [1, 1, 1, 1, 1],
        [3, 2],
      ],
      [[6], null],
    ];
    const all = subsetsOf(['low', 'mid', 'high']);
    for (const [subs, grouping] of grids) {
      const n = subs.reduce((a, b) => a + b, 0);
      const w = weightsOf(barTree(subs, grouping));
      expect(w.length).toBe(n);
      expect(
        greatest(
          w,
          w.map(() => all),
        ),
        `${subs} ${grouping}`,
      ).toBe(bruteForceGreatest(w));
    }
  });

  it('reaches 46 at most on 4/4 sixteenths: every odd sixteenth against the hi-hat alone', () => {
    // derived: only an odd sixteenth (−4) can start a pair inside the bar; at best each of the
    // seven pairs 1→2, 3→4, …, 13→14 is a kick or snare against the hi-hat alone (I = 5), with
    // differences 1, 2, 1, 3, 1, 2, 1.
    const all = subsetsOf(['low', 'mid', 'high']);
    const most = greatest(
      FOUR_FOUR,
      FOUR_FOUR.map(() => all),
    );
    expect(most).toBe(1 + 2 + 1 + 3 + 1 + 2 + 1 + 7 * 5);
  });
});
