/**
 * The engraving rules of the notation model (the browser test checks the same rules on the drawn
 * SVG): whole-bar and half-bar rests, tuplets in their grid value, one "5" then "sim." in a
 * quintuplet drill (numbers kept where a group does not count itself) and every "3" in a shuffle, the polyrhythm's own grouping, and the notes that make a bar tense.
 */
import { describe, expect, it } from 'vitest';
import type { DrillBar, DrillHit, VoiceId } from '../generator/drill';
import { generateDrill, parseRuleCard } from '../generator/index';
import { BUILT_IN_PRESETS } from '../generator/presets/index';
import { buildNotation, type NotationSource } from './notation-model';
import { polyrhythmGroups } from './polyrhythm';
import { syncopatedInstants } from './syncopation';

const FEET: VoiceId[] = ['kick', 'hihatFoot'];

function hit(beat: number, slot: number, voice: VoiceId, extra: Partial<DrillHit> = {}): DrillHit {
  const hand = FEET.includes(voice) ? null : 'R';
  return { beat, slot, voice, dynamic: 'normal', hand, source: 'fill', ...extra };
}

function barOf(beats: number[], hits: DrillHit[]): DrillBar {
  return { bar: 1, beats, tension: 0, hits };
}

function drillOf(beats: number[], hits: DrillHit[], unit = 4, grouping?: number[]): NotationSource {
  return {
    card: {
      meter: { beats: beats.length, unit, ...(grouping ? { grouping } : {}) },
      voices: ['hihat', 'snare', 'kick'],
    },
    bars: [barOf(beats, hits)],
  };
}

const preset = (id: string) => {
  const found = BUILT_IN_PRESETS.find((p) => p.id === id);
  if (!found) throw new Error(`no preset ${id}`);
  return found;
};

/** The feet's events of bar 1 as `r2 4 …` (r: rest, d: dotted, R: whole-bar rest). */
function feet(source: NotationSource): string {
  const layer = buildNotation(source).bars[0]!.layers.find((l) => l.layer === 'feet')!;
  return layer.events
    .map((e) =>
      e.barRest
        ? 'R'
        : `${e.kind === 'rest' ? 'r' : ''}${e.duration.value}${e.duration.dots ? 'd' : ''}`,
    )
    .join(' ');
}

const hats = (beats: number) => Array.from({ length: beats }, (_, b) => hit(b + 1, 0, 'hihat'));

describe('rests', () => {
  // E. Gould, "Behind Bars", Faber Music 2011, ch. "Rests" (from memory): a whole rest fills any
  // silent bar whatever the meter; in 4/4 a half rest covers beats 1–2 or 3–4, never 2–3.
  it('a voice silent for a whole bar gets one whole-bar rest, in 4/4, 3/4, 6/8 and 7/8', () => {
    expect(feet(drillOf([4, 4, 4, 4], hats(4)))).toBe('R');
    expect(feet(drillOf([4, 4, 4], hats(3)))).toBe('R');
    expect(feet(drillOf([1, 1, 1, 1, 1, 1], hats(6), 8, [3, 3]))).toBe('R');
    expect(feet(drillOf([1, 1, 1, 1, 1, 1, 1], hats(7), 8, [2, 2, 3]))).toBe('R');
  });

  it('a silent half of a 4/4 bar is one half rest; beats 2 and 3 keep two quarter rests', () => {
    expect(feet(drillOf([4, 4, 4, 4], [hit(1, 0, 'kick')]))).toBe('4 r4 r2');
    expect(feet(drillOf([4, 4, 4, 4], [hit(4, 0, 'kick')]))).toBe('r2 r4 4');
    expect(feet(drillOf([4, 4, 4, 4], [hit(1, 0, 'kick'), hit(4, 0, 'kick')]))).toBe('4 r4 r4 4');
    // 3/4 has no half-bar: two quarter rests (common practice).
    expect(feet(drillOf([4, 4, 4], [hit(3, 0, 'kick')]))).toBe('r4 r4 4');
  });

  it('rests inside a beat start on a multiple of their own length (consolidated by beat)', () => {
    expect(feet(drillOf([4, 4, 4, 4], [hit(1, 3, 'kick'), hit(3, 0, 'kick')]))).toBe(
      'r8 r16 16 r4 4 r4',
    );
  });
});

describe('tuplets', () => {
  it('combines the rests of a quintuplet and a septuplet by their own grid', () => {
    const five = (slots: number[]) =>
      feet(
        drillOf(
          [5],
          slots.map((s) => hit(1, s, 'kick')),
        ),
      );
    expect(five([0, 1])).toBe('16 16 r8 r16');
    expect(five([0, 4])).toBe('16 r16 r8 16');
    // 3+2 where the fourth value starts the second group: the first group's rests combine.
    expect(five([0, 3])).toBe('16 r8 16 r16');
    // 2+3: the second group's sixteenth and eighth rest (common practice).
    expect(five([1, 2])).toBe('r16 16 16 r8');
    const seven = (slots: number[]) =>
      feet(
        drillOf(
          [7],
          slots.map((s) => hit(1, s, 'kick')),
        ),
      );
    expect(seven([0, 1])).toBe('16 16 r8 r8 r16');
    expect(seven([0, 6])).toBe('16 r16 r8 r8 16');
    // A sextuplet keeps a rest a slot: its halves (3 + 3) stay visible (common practice).
    const six = feet(drillOf([6], [hit(1, 0, 'kick'), hit(1, 1, 'kick')]));
    expect(six).toBe('16 16 r16 r16 r16 r16');
  });

  it('spells every quintuplet and septuplet beat in its grid value, a rest on every hole', () => {
    for (const id of ['quintuplets-hihat-1-3-4', 'quintuplets-hihat-1-3-5']) {
      const drill = generateDrill(parseRuleCard(preset(id).card), 'lesson-12');
      const model = buildNotation(drill);
      for (const bar of model.bars) {
        for (const layer of bar.layers) {
          for (const tuplet of layer.tuplets) {
            const events = tuplet.events.map((i) => layer.events[i]!);
            // Every note in the grid value (a sixteenth under the 5), the rests between them
            // combined up to an eighth inside the quintuplet's inner groups, 2+3, or 3+2 where a
            // note on its fourth value and none on its third starts the second (Gould, "Behind
            // Bars", ch. "Tuplets"; from memory). Never a quarter rest under the 5: it reads as a
            // whole beat's rest (common practice).
            const noteAt = new Set(events.filter((e) => e.kind === 'note').map((e) => e.slot));
            const split = noteAt.has(3) && !noteAt.has(2) ? 3 : 2;
            const group = (slot: number) => (slot < split ? 0 : 1);
            const sixteenths = (e: (typeof events)[number]) => 16 / e.duration.value;
            let at = 0;
            for (const [k, e] of events.entries()) {
              const where = `${id} bar ${bar.bar} beat ${e.beat}`;
              expect(e.slot, where).toBe(at);
              expect(e.duration.dots).toBe(0);
              if (e.kind === 'note') expect(e.duration.value).toBe(16);
              else {
                expect(sixteenths(e), `${where}: rest past an eighth`).toBeLessThan(3);
                expect(group(at), `${where}: rest across the groups`).toBe(
                  group(at + sixteenths(e) - 1),
                );
              }
              const next = events[k + 1];
              if (
                e.kind === 'rest' &&
                next?.kind === 'rest' &&
                sixteenths(next) === 1 &&
                sixteenths(e) === 1
              )
                expect(group(at + 1), `${where}: rests to combine`).not.toBe(group(at));
              at += sixteenths(e);
            }
            expect(at).toBe(tuplet.ratio.numNotes);
          }
        }
      }
    }
  });

  it('keeps a shuffle\'s "3" on every group of each voice, with no "sim."', () => {
    const drill = generateDrill(parseRuleCard(preset('shuffle-kick-upbeats').card), 'lesson-12');
    const bars = buildNotation(drill).bars;
    for (const name of ['hands', 'feet'] as const) {
      const layers = bars.flatMap((bar) => bar.layers.filter((l) => l.layer === name));
      const tuplets = layers.flatMap((layer) => layer.tuplets);
      expect(tuplets.length, name).toBeGreaterThan(4);
      // Common practice: a quarter and an eighth under a "3" read as straight eighths without
      // it, so a shuffle part marks every group (the number alone where one beam spans it).
      expect(
        tuplets.filter((t) => !t.shown || t.simile),
        name,
      ).toEqual([]);
      const quarterAndEighth = layers.flatMap((layer) =>
        layer.tuplets.filter((t) => t.events.some((i) => layer.events[i]!.duration.value === 4)),
      );
      expect(quarterAndEighth.length, name).toBeGreaterThan(0);
      expect(quarterAndEighth.every((t) => t.bracketed)).toBe(true);
    }
  });

  it('drops a quintuplet drill\'s "5" after "sim." only where no "5" comes back after it', () => {
    let marked = 0;
    for (const id of ['quintuplets-hihat-1-3-4', 'quintuplets-hihat-1-3-5']) {
      for (const seed of ['lesson-12', 'cedar-5', 'moss-21', 's17', 's25']) {
        const bars = buildNotation(generateDrill(parseRuleCard(preset(id).card), seed)).bars;
        for (const name of ['hands', 'feet'] as const) {
          const layers = bars.flatMap((bar) => bar.layers.filter((l) => l.layer === name));
          const groups = layers.flatMap((layer) =>
            layer.tuplets.map((t, i) => ({ t, layer, next: layer.tuplets[i + 1] })),
          );
          const where = `${id} ${seed} ${name}`;
          // Gould, "Behind Bars", ch. "Tuplets" (from memory): numbers may be dropped once the
          // pattern is established, but only where unambiguous. Five sixteenth notes count
          // themselves; a rest among them, or four or fewer values, read as plain sixteenths
          // (common practice).
          for (const { t, layer } of groups) {
            const sixteenths = t.events.every((i) => layer.events[i]!.duration.value === 16);
            const played = t.events.every((i) => layer.events[i]!.kind === 'note');
            if (!t.shown) expect(t.events.length === 5 && sixteenths && played, where).toBe(true);
            if (t.events.length < 5 || !played) expect(t.shown, where).toBe(true);
          }
          const similes = groups.filter(({ t }) => t.simile);
          expect(similes.length, where).toBeLessThanOrEqual(1);
          // "Sim." stands over the next beat: that beat is a group of five, never a plain rest.
          for (const { t, layer, next } of similes) {
            expect(t.shown, where).toBe(true);
            expect(next?.events[0], where).toBe(t.events.at(-1)! + 1);
            expect(next!.events.length, where).toBe(5);
            expect(
              next!.events.every((i) => layer.events[i]!.kind === 'note'),
              where,
            ).toBe(true);
            expect(layer.events[next!.events[0]!]!.duration.value, where).toBe(16);
          }
          // Before "sim." every number is shown, after it none: a number coming back after
          // "sim." would contradict it (common practice), so a voice whose later groups do not
          // all count themselves has no "sim." and every number.
          const at = groups.findIndex(({ t }) => t.simile);
          const before = at < 0 ? groups : groups.slice(0, at);
          expect(
            before.every(({ t }) => t.shown),
            where,
          ).toBe(true);
          expect(
            groups.slice(at < 0 ? groups.length : at + 1).every(({ t }) => !t.shown),
            where,
          ).toBe(true);
          if (at >= 0) marked++;
        }
      }
    }
    expect(marked).toBeGreaterThan(0);
  });

  it('keeps the "5" on a kick group with a combined rest, after the hands\' "sim."', () => {
    const hands = [1, 2, 3, 4].flatMap((b) => [0, 1, 2, 3, 4].map((s) => hit(b, s, 'hihat')));
    // Kick on 1 and "ti" of every beat: a sixteenth, rests at 1–3, a sixteenth.
    const feet = [1, 2, 3, 4].flatMap((b) => [hit(b, 0, 'kick'), hit(b, 4, 'kick')]);
    const model = buildNotation(drillOf([5, 5, 5, 5], [...hands, ...feet]));
    const [handsBar, feetBar] = model.bars[0]!.layers;
    expect(handsBar!.tuplets.map((t) => [t.shown, t.simile])).toEqual([
      [true, true],
      [false, false],
      [false, false],
      [false, false],
    ]);
    expect(feetBar!.tuplets.every((t) => t.events.length < 5 && t.shown && !t.simile)).toBe(true);
  });

  // Gould, "Behind Bars", ch. "Tuplets" (from memory): where one beam joins exactly the tuplet's
  // notes the number stands alone; a bracket is kept where the beam does not show the group.
  it('leaves out the bracket line only where one beam spans exactly the group', () => {
    const bracketed = (slots: number[]) =>
      buildNotation(
        drillOf(
          [5],
          slots.map((s) => hit(1, s, 'hihat')),
        ),
      ).bars[0]!.layers[0]!.tuplets.map((t) => t.bracketed);
    // Notes at both ends, one beam over them, rests inside: the number alone.
    expect(bracketed([0, 1, 2, 3, 4])).toEqual([false]);
    expect(bracketed([0, 2, 4])).toEqual([false]);
    // A rest at either end: the beam stops short of the group, so the bracket stays.
    expect(bracketed([0, 2, 3])).toEqual([true]);
    expect(bracketed([1, 2, 4])).toEqual([true]);
    // A lone note has no beam at all.
    expect(bracketed([2])).toEqual([true]);
  });

  it('keeps every bracket where tuplets come and go (a drill not in triplets throughout)', () => {
    const model = buildNotation(drillOf([3, 4, 3, 4], [hit(1, 1, 'snare'), hit(3, 2, 'snare')]));
    const tuplets = model.bars[0]!.layers[0]!.tuplets;
    expect(tuplets).toHaveLength(2);
    expect(tuplets.every((t) => t.shown && !t.simile)).toBe(true);
  });
});

describe('polyrhythm grouping', () => {
  it('groups each 4:3 cycle, labelled "4 vs 3" (no ratio), over exactly its four notes', () => {
    const drill = generateDrill(parseRuleCard(preset('four-over-three').card), 'lesson-12');
    const groups = buildNotation(drill).polyrhythms;
    expect(groups).toHaveLength(drill.bars.length);
    groups.forEach((group, i) => {
      // Spelled at real values, so no tuplet ratio over them (E. Gould, "Behind Bars", Faber
      // Music 2011, ch. "Tuplets", from memory); "4 vs 3" as a label: common practice.
      expect(group.label).toBe('4 vs 3');
      expect(group.below).toBe(true);
      // Hit k of a cycle at k·3/4 beats: beat 1, the "a" of 1, the "&" of 2, the "e" of 3.
      expect(group.notes).toEqual([
        { bar: i + 1, beat: 1, slot: 0 },
        { bar: i + 1, beat: 1, slot: 3 },
        { bar: i + 1, beat: 2, slot: 2 },
        { bar: i + 1, beat: 3, slot: 1 },
      ]);
    });
  });

  it('runs a cycle across the bar line when its span does not divide the bar (polymeter)', () => {
    const bars = [1, 2].map((bar) => ({
      bar,
      beats: [4, 4, 4, 4],
      hits: [0, 1, 2, 3].flatMap((b) => [0, 1, 2, 3].map((s) => hit(b + 1, s, 'snare'))),
    }));
    const groups = polyrhythmGroups(
      [{ kind: 'polyrhythm', voices: ['snare'], against: 4, span: 3 }],
      bars,
      4,
    );
    // Cycles at beats 0 and 3 (crossing into bar 2) of 8 beats; the one at 6 would run past.
    expect(groups.map((g) => g.notes)).toEqual([
      [
        { bar: 1, beat: 1, slot: 0 },
        { bar: 1, beat: 1, slot: 3 },
        { bar: 1, beat: 2, slot: 2 },
        { bar: 1, beat: 3, slot: 1 },
      ],
      [
        { bar: 1, beat: 4, slot: 0 },
        { bar: 1, beat: 4, slot: 3 },
        { bar: 2, beat: 1, slot: 2 },
        { bar: 2, beat: 2, slot: 1 },
      ],
    ]);
    expect(groups.every((g) => !g.below)).toBe(true);
  });
});

describe('the notes that make a bar tense', () => {
  it('marks a note whose next stronger position is silent (the early backbeat on the "a")', () => {
    const bar = barOf([4, 4, 4, 4], [hit(1, 0, 'kick'), hit(1, 3, 'snare'), hit(3, 0, 'kick')]);
    expect(syncopatedInstants(bar)).toEqual([{ beat: 1, slot: 3 }]);
  });

  it('reads the ostinato as silence, as the tension does', () => {
    const bar = barOf(
      [4, 4, 4, 4],
      [hit(1, 3, 'snare'), hit(2, 0, 'hihat', { source: 'ostinato' }), hit(3, 0, 'kick')],
    );
    expect(syncopatedInstants(bar)).toEqual([{ beat: 1, slot: 3 }]);
  });

  it('reads the grouping: in 7/8 as 2+2+3 the 2nd eighth leads to the silent 3rd', () => {
    const bar = barOf([1, 1, 1, 1, 1, 1, 1], [hit(1, 0, 'kick'), hit(2, 0, 'snare')]);
    expect(syncopatedInstants(bar, [2, 2, 3])).toEqual([{ beat: 2, slot: 0 }]);
  });

  it('marks notes only in tense bars: every built-in preset, 10 seeds', () => {
    for (const p of BUILT_IN_PRESETS) {
      for (let seed = 0; seed < 10; seed++) {
        const drill = generateDrill(parseRuleCard(p.card), `tension-${seed}`);
        for (const bar of buildNotation(drill).bars) {
          if (bar.syncopated.length > 0)
            expect(bar.tension, `${p.id} bar ${bar.bar}`).toBeGreaterThan(0);
        }
      }
    }
  });
});
