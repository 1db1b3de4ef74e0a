import { describe, expect, it } from 'vitest';
import { generateDrill, parseRuleCard } from '../generator/index';
import { FORMAT_CARDS, formatDrills } from '../../tests/formats/drills';
import { readScore } from '../../tests/formats/musicxml-reading';
import { STAFF_PLACEMENTS } from '../notation/staff-placement';
import { drillToMusicXml, durationOf } from './musicxml-export';

const drills = formatDrills();
const drill = (name: string) => drills.find(([n]) => n === name)![1];
const text = (el: Element, tag: string) => el.getElementsByTagName(tag)[0]?.textContent ?? null;

describe('drillToMusicXml', () => {
  for (const [name, d] of drills) {
    it(`writes the ${name} drill: well-formed, every voice filling every bar, every hit at its time`, () => {
      const score = readScore(drillToMusicXml(d, name));
      const { beats, unit } = d.card.meter;
      expect([score.beats, score.beatType]).toEqual([beats, unit]);
      // A bar lasts beats × (4 / beat type) quarter notes, read from the file's own attributes.
      const bar = (score.divisions * 4 * score.beats) / score.beatType;
      expect(score.voiceTotals).toHaveLength(d.bars.length);
      for (const totals of score.voiceTotals) {
        expect(totals.size).toBeGreaterThan(0);
        for (const total of totals.values()) expect(total).toBe(bar);
      }
      // Each hit is a note starting where the hit falls: (beat − 1 + slot / slots) beats in.
      const beatLength = (score.divisions * 4) / score.beatType;
      const expected = d.bars
        .flatMap((b, m) =>
          b.hits.map(
            (h) =>
              `${m}@${(((h.beat - 1) * b.beats[h.beat - 1]! + h.slot) * beatLength) / b.beats[h.beat - 1]!}:P1-${h.voice}`,
          ),
        )
        .sort();
      const found = score.notes
        .filter((n) => !n.rest)
        .map((n) => `${n.measure}@${n.start}:${n.instrument}`)
        .sort();
      expect(found).toEqual(expected);
    });
  }

  it('places every head by the notation’s staff-placement table, cymbals with x heads', () => {
    const score = readScore(drillToMusicXml(drill('sixteenth beats'), 'x'));
    const seen = new Set<string>();
    for (const note of score.notes.filter((n) => !n.rest)) {
      const voice = note.instrument!.replace('P1-', '') as keyof typeof STAFF_PLACEMENTS;
      const placement = STAFF_PLACEMENTS[voice];
      expect(text(note.element, 'display-step')).toBe(placement.displayStep);
      expect(Number(text(note.element, 'display-octave'))).toBe(placement.displayOctave);
      const head = text(note.element, 'notehead');
      expect(head ?? 'normal').toBe(placement.notehead);
      // Hands stems up in voice 1, feet stems down in voice 2 (common practice).
      expect(text(note.element, 'stem')).toBe(placement.layer === 'hands' ? 'up' : 'down');
      expect(note.voice).toBe(placement.layer === 'hands' ? '1' : '2');
      seen.add(voice);
    }
    expect(seen.has('hihat') && seen.has('rideBell') && seen.has('kick')).toBe(true);
  });

  it('writes ghost notes in parentheses, accents, and the open hi-hat circle', () => {
    for (const [, d] of drills) {
      const score = readScore(drillToMusicXml(d, 'x'));
      const heads = score.notes.filter((n) => !n.rest);
      const hits = d.bars.flatMap((b) => b.hits);
      const ghosts = heads.filter(
        (n) => n.element.getElementsByTagName('notehead')[0]?.getAttribute('parentheses') === 'yes',
      );
      expect(ghosts).toHaveLength(hits.filter((h) => h.dynamic === 'ghost').length);
      const accented = score.doc.getElementsByTagName('accent').length;
      expect(accented > 0).toBe(hits.some((h) => h.dynamic === 'accent'));
      const open = score.doc.getElementsByTagName('open').length;
      expect(open).toBe(hits.filter((h) => h.voice === 'hihatOpen').length);
    }
  });

  it('brackets quintuplets and septuplets with time-modification and tuplet notations', () => {
    for (const [name, actual] of [
      ['quintuplets', '5'],
      ['septuplets', '7'],
    ] as const) {
      const score = readScore(drillToMusicXml(drill(name), name));
      const mods = Array.from(score.doc.getElementsByTagName('time-modification'));
      expect(mods.length).toBeGreaterThan(0);
      for (const mod of mods) {
        expect(text(mod, 'actual-notes')).toBe(actual);
        expect(text(mod, 'normal-notes')).toBe('4');
      }
      const tuplets = Array.from(score.doc.getElementsByTagName('tuplet'));
      const starts = tuplets.filter((t) => t.getAttribute('type') === 'start');
      const stops = tuplets.filter((t) => t.getAttribute('type') === 'stop');
      // One bracket a beat: each beat of these drills is one tuplet in each voice that plays it.
      expect(starts.length).toBe(stops.length);
      expect(starts.length).toBeGreaterThanOrEqual(drill(name).bars.length * 4);
    }
  });

  it('writes two voices with a backup to the bar’s start, and beams in groups', () => {
    const score = readScore(drillToMusicXml(drill('6/8'), 'x'));
    const measure = score.doc.getElementsByTagName('measure')[0]!;
    expect(measure.getElementsByTagName('backup')).toHaveLength(1);
    expect(text(measure.getElementsByTagName('backup')[0]!, 'duration')).toBe(String(6 * 840));
    // 6/8 hi-hat eighths beamed in threes (common practice): begin, continue, end, twice.
    const hands = score.notes.filter((n) => n.measure === 0 && n.voice === '1' && !n.rest);
    const beams = hands
      .filter((n) => !n.element.getElementsByTagName('chord').length)
      .map((n) => text(n.element, 'beam'));
    expect(beams).toEqual(['begin', 'continue', 'end', 'begin', 'continue', 'end']);
  });

  it('marks the tempo: the metronome in the beat’s note and sound tempo in quarters', () => {
    const score = readScore(drillToMusicXml(drill('6/8'), 'x'));
    // 132 eighths a minute: a dotted quarter at 44, i.e. 66 quarter notes a minute.
    const metronome = score.doc.getElementsByTagName('metronome')[0]!;
    expect(text(metronome, 'beat-unit')).toBe('quarter');
    expect(metronome.getElementsByTagName('beat-unit-dot')).toHaveLength(1);
    expect(text(metronome, 'per-minute')).toBe('44');
    expect(score.doc.getElementsByTagName('sound')[0]!.getAttribute('tempo')).toBe('66');
    const seven = readScore(drillToMusicXml(drill('7/8'), 'x'));
    expect(text(seven.doc.getElementsByTagName('direction')[1]!, 'words')).toBe('2+2+3');
  });

  it('writes the card’s swing for playback: 2 : 1 eighths for a triplet feel', () => {
    const score = readScore(drillToMusicXml(drill('four over three'), 'x'));
    const swing = score.doc.getElementsByTagName('swing')[0]!;
    expect([text(swing, 'first'), text(swing, 'second'), text(swing, 'swing-type')]).toEqual([
      '2',
      '1',
      'eighth',
    ]);
    expect(
      readScore(drillToMusicXml(drill('6/8'), 'x')).doc.getElementsByTagName('swing'),
    ).toHaveLength(0);
  });

  it('escapes the title and fills silent bars with one measure rest', () => {
    const card = {
      ...(FORMAT_CARDS['septuplets'] as object),
      voices: ['snare', 'hihat', 'kick'],
      layers: [],
    };
    const d = generateDrill(parseRuleCard(card), 'formats');
    const silentFeet = {
      ...d,
      bars: d.bars.map((b) => ({ ...b, hits: b.hits.filter((h) => h.voice !== 'kick') })),
    };
    const score = readScore(drillToMusicXml(silentFeet, 'Tom & Jo’s <groove>'));
    expect(text(score.doc.documentElement, 'work-title')).toBe('Tom & Jo’s <groove>');
    const rests = Array.from(score.doc.querySelectorAll('rest[measure="yes"]'));
    expect(rests).toHaveLength(d.bars.length);
  });

  it('computes durations from value, dot and tuplet ratio in whole divisions', () => {
    const dur = (value: number, dots: 0 | 1) => ({ duration: { value, dots } });
    expect(durationOf(dur(4, 1), null, 1680)).toBe(2520);
    expect(durationOf(dur(16, 0), { numNotes: 5, notesOccupied: 4 }, 1680)).toBe(336);
    expect(durationOf(dur(32, 0), { numNotes: 7, notesOccupied: 4 }, 1680)).toBe(120);
    // A 128th at 1680 a quarter would be 52.5 divisions: refused, never rounded.
    expect(() => durationOf(dur(128, 0), null, 1680)).toThrow();
  });
});
