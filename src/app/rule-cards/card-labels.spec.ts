import { describe, expect, it } from 'vitest';

import { meterLabel, subdivisionLabel } from './card-labels';

// Note values follow standard notation (common practice): two slots per quarter-note beat are
// eighths, two per eighth-note beat are sixteenths; odd splits of a beat are its tuplets.
describe('card labels', () => {
  it('writes meters as time signatures', () => {
    expect(meterLabel({ beats: 4, unit: 4 })).toBe('4/4');
    expect(meterLabel({ beats: 7, unit: 8 })).toBe('7/8');
    expect(meterLabel(undefined)).toBe('—');
  });

  it('names even subdivisions by the note value they make with the beat unit', () => {
    expect(subdivisionLabel(4, { beats: 4, unit: 4 })).toBe('sixteenths');
    expect(subdivisionLabel(2, { beats: 4, unit: 4 })).toBe('eighths');
    expect(subdivisionLabel(2, { beats: 6, unit: 8 })).toBe('sixteenths');
    expect(subdivisionLabel(8, { beats: 4, unit: 4 })).toBe('thirty-seconds');
    expect(subdivisionLabel(1, { beats: 3, unit: 4 })).toBe('one per beat');
  });

  it('names odd subdivisions as tuplets, and mixed lists by their parts', () => {
    expect(subdivisionLabel(5)).toBe('quintuplets');
    expect(subdivisionLabel(3)).toBe('triplets');
    expect(subdivisionLabel([4, 4, 3, 3], { beats: 4, unit: 4 })).toBe(
      'mixed: sixteenths, triplets',
    );
    expect(subdivisionLabel([6, 6])).toBe('sextuplets');
  });
});
