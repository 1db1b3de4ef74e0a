import { JSDOM } from 'jsdom';

/** A MusicXML note as a test reads it: where it starts in its bar and what it is. */
export interface ReadNote {
  readonly measure: number;
  readonly voice: string;
  /** Divisions from the start of the measure. */
  readonly start: number;
  readonly duration: number;
  readonly rest: boolean;
  readonly instrument: string | null;
  readonly element: Element;
}

export interface ReadScore {
  readonly doc: Document;
  readonly divisions: number;
  readonly beats: number;
  readonly beatType: number;
  readonly notes: ReadNote[];
  /** Per measure, per voice: the sum of the voice's note durations (chords counted once). */
  readonly voiceTotals: Map<string, number>[];
}

const parser = new new JSDOM('').window.DOMParser();

/** Parses the document (throws when it is not well-formed XML) and walks every measure. */
export function readScore(xml: string): ReadScore {
  const doc = parser.parseFromString(xml, 'application/xml');
  const error = doc.getElementsByTagName('parsererror')[0];
  if (error) throw new Error(`Not well-formed XML: ${error.textContent}`);
  const number = (el: Element | null | undefined, tag: string) =>
    Number(el?.getElementsByTagName(tag)[0]?.textContent);
  const attributes = doc.getElementsByTagName('attributes')[0];
  const notes: ReadNote[] = [];
  const voiceTotals: Map<string, number>[] = [];
  Array.from(doc.getElementsByTagName('measure')).forEach((measure, m) => {
    let at = 0;
    let lastStart = 0;
    const totals = new Map<string, number>();
    for (const child of Array.from(measure.children)) {
      if (child.tagName === 'backup') at -= number(child, 'duration');
      else if (child.tagName === 'forward') at += number(child, 'duration');
      else if (child.tagName === 'note') {
        const chord = child.getElementsByTagName('chord').length > 0;
        const duration = number(child, 'duration');
        const voice = child.getElementsByTagName('voice')[0]?.textContent ?? '1';
        const start = chord ? lastStart : at;
        notes.push({
          measure: m,
          voice,
          start,
          duration,
          rest: child.getElementsByTagName('rest').length > 0,
          instrument: child.getElementsByTagName('instrument')[0]?.getAttribute('id') ?? null,
          element: child,
        });
        if (!chord) {
          totals.set(voice, (totals.get(voice) ?? 0) + duration);
          lastStart = at;
          at += duration;
        }
      }
    }
    voiceTotals.push(totals);
  });
  return {
    doc,
    divisions: number(attributes, 'divisions'),
    beats: number(attributes, 'beats'),
    beatType: number(attributes, 'beat-type'),
    notes,
    voiceTotals,
  };
}
