import { describe, expect, it } from 'vitest';
import { createGrid } from './grid';
import {
  assignHands,
  handRested,
  isFastGrid,
  MAX_HAND_NOTES_PER_SECOND,
  type WorkHit,
} from './hands';
import { generateDrill, parseRuleCard, RuleConflictError } from './index';

const hit = (voice: WorkHit['voice'], source: WorkHit['source'] = 'fill'): WorkHit => ({
  voice,
  source,
  dynamic: 'normal',
  rule: 0,
  hand: null,
});

describe('hands', () => {
  it('allows one hand 12 notes a second: sixteenths at 180 bpm, not at 200', () => {
    expect(MAX_HAND_NOTES_PER_SECOND).toBe(12);
    const grid = createGrid(1, [4, 4, 4, 4]);
    // 60 000 / (180 × 4) = 83.3 ms = 1/12 s between sixteenths (ms = 60 000 / (BPM × notes per beat)).
    expect(isFastGrid(grid, 180)).toBe(false);
    expect(isFastGrid(grid, 200)).toBe(true);
    expect(handRested(grid, 200, 2 * (grid.ticksPerBeat / 4))).toBe(true);
  });

  it('leads with the right hand on the ostinato, the left on what meets it', () => {
    const grid = createGrid(1, [2]);
    const cells = [[hit('hihat', 'ostinato'), hit('snare', 'backbeat')], [hit('snare')]];
    expect(assignHands(grid, 100, 'hihat', cells)).toBeNull();
    expect(cells[0]!.map((h) => h.hand)).toEqual(['R', 'L']);
    expect(cells[1]![0]!.hand).toBe('L');
  });

  it('alternates an ostinato that is too fast for one hand', () => {
    const grid = createGrid(1, [4, 4, 4, 4]);
    const cells = Array.from({ length: 16 }, () => [hit('hihat', 'ostinato')]);
    expect(assignHands(grid, 200, 'hihat', cells)).toBeNull();
    expect(cells.slice(0, 4).map((c) => c[0]!.hand)).toEqual(['R', 'L', 'R', 'L']);
  });

  it('gives feet no hand and refuses three hands', () => {
    const grid = createGrid(1, [1]);
    const feet = [[hit('kick'), hit('hihatFoot')]];
    expect(assignHands(grid, 100, undefined, feet)).toBeNull();
    expect(feet[0]!.map((h) => h.hand)).toEqual([null, null]);
    const three = [[hit('snare'), hit('ride'), hit('tomFloor')]];
    expect(assignHands(grid, 100, undefined, three)).toEqual({
      instant: 0,
      reason: 'tooManyHands',
    });
  });

  it('refuses cards whose obligations need three hands or are too fast', () => {
    const threeHands = parseRuleCard({
      voices: ['snare', 'ride', 'tomFloor'],
      ostinato: { voice: 'ride', slots: [0] },
      rules: [
        { kind: 'backbeat', voice: 'snare', beats: [2] },
        { kind: 'backbeat', voice: 'tomFloor', beats: [2] },
      ],
    });
    expect(() => generateDrill(threeHands, 'x')).toThrow(/only two hands/);
    const tooFast = parseRuleCard({
      tempo: 300,
      subdivision: 4,
      voices: ['snare', 'ride'],
      ostinato: { voice: 'ride', slots: [0, 1, 2, 3] },
      rules: [{ kind: 'backbeat', voice: 'snare', beats: [2], shift: 1 }],
    });
    expect(() => generateDrill(tooFast, 'x')).toThrow(RuleConflictError);
  });
});

describe('hands around the loop', () => {
  it('carries the sticking over the seam from the last bar into the first', () => {
    // 3 beats of sixteenths at 200 bpm: too fast for one hand, alternating R L … ends on L,
    // so the next repetition starts on R without a double.
    const grid = createGrid(1, [4, 4, 4]);
    const cells = Array.from({ length: 12 }, () => [hit('snare')]);
    expect(assignHands(grid, 200, undefined, cells)).toBeNull();
    expect(cells.map((c) => c[0]!.hand).join('')).toBe('RLRLRLRLRLRL');
  });

  it('refuses an odd run of fast single strokes that cannot alternate round the loop', () => {
    // 15 quintuplet strokes a bar at 150 bpm (12.5 a second): one hand must play two in a row.
    const grid = createGrid(1, [5, 5, 5]);
    const cells = Array.from({ length: 15 }, () => [hit('snare')]);
    expect(assignHands(grid, 150, undefined, cells)).toEqual({ instant: 14, reason: 'tooFast' });
  });
});
