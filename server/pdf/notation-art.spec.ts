import { describe, expect, it } from 'vitest';
import { clearNotationCache, notationArt } from './notation-art';
import { drawArt } from './render-worksheet';
import { ALL_AIDS, presetDrill, samplePrint } from './testing/sample-print';
import { textArea } from './worksheet-document';

describe('notationArt', () => {
  const drill = presetDrill('early-backbeat', 4, 'cache-1').drill;

  it('keeps a drawing for the same drill, aids and room, and draws anew for any other', () => {
    clearNotationCache();
    const first = notationArt(drill, ALL_AIDS, 0.6);
    expect(notationArt(drill, ALL_AIDS, 0.6)).toBe(first);
    // A copy of the drill (as read again from the database) finds the same drawing.
    expect(notationArt(structuredClone(drill), ALL_AIDS, 0.6)).toBe(first);
    const withoutCounts = notationArt(drill, { ...ALL_AIDS, counts: false }, 0.6);
    expect(withoutCounts).not.toBe(first);
    expect(withoutCounts.svg).not.toBe(first.svg);
    const other = presetDrill('early-backbeat', 4, 'cache-2').drill;
    expect(notationArt(other, ALL_AIDS, 0.6).svg).not.toBe(first.svg);
  }, 60_000);

  it('gives from its cache what a fresh engraving gives', () => {
    const kept = notationArt(drill, ALL_AIDS, 0.6);
    clearNotationCache();
    const fresh = notationArt(drill, ALL_AIDS, 0.6);
    expect(fresh).not.toBe(kept);
    // VexFlow numbers its elements from a running counter; print drawings carry no ids.
    expect(fresh).toEqual(kept);
  }, 60_000);

  // A quintuplet bar is too wide for two to a system on the page's own line: a longer line
  // holds two, printed a little smaller, rather than four lone bars stretched line after line.
  it('sets a 4-bar quintuplet drill two bars to a system, its text still at least 7 pt', async () => {
    clearNotationCache();
    for (const seed of ['seed-1', 'lesson-12']) {
      const print = samplePrint([presetDrill('quintuplets-hihat-1-3-5', 4, seed)]);
      const [art] = await drawArt(print);
      const { svg, width } = art!.notation;
      // One percussion clef (SMuFL U+E069) opens each system.
      const systems = svg.split('\u{E069}').length - 1;
      expect(systems, seed).toBe(2);
      // The notation is scaled onto the text width; sticking and counts print at 7 pt or more,
      // the least read from a music stand (common practice; see shared/notation/print-layout.ts).
      const scale = textArea(print.paper).width / width;
      // The rows are the texts made of one span a letter or syllable.
      const rows = /<text font-family="Academico[^"]*" font-size="([\d.]+)"[^>]*><tspan/g;
      const sizes = [...svg.matchAll(rows)].map((m) => Number(m[1]) * scale);
      expect(sizes.length).toBeGreaterThan(0);
      expect(Math.min(...sizes), seed).toBeGreaterThanOrEqual(7);
    }
  }, 60_000);
});
