import { generateDrill, parseRuleCard, type Drill } from '../../shared/generator/index';
import { findBuiltInPreset } from '../../shared/generator/presets/index';

const preset = (id: string) => findBuiltInPreset(id)!.card;

/**
 * Drills the format tests write and read back: every tuplet grid, a polyrhythm, compound and odd
 * meters and sixteenth beats, each a card and a seed.
 */
export const FORMAT_CARDS: Readonly<Record<string, unknown>> = {
  quintuplets: preset('quintuplets-hihat-1-3-4'),
  // Swung, for the MusicXML swing element (playback only: the notes stay straight).
  'four over three': {
    ...(preset('four-over-three') as object),
    swing: { unit: 8, ratio: 0.6667 },
  },
  '6/8': preset('six-eight-groove'),
  '12/8 shuffle': preset('twelve-eight-shuffle'),
  '7/8': preset('seven-eight-two-two-three'),
  septuplets: {
    meter: { beats: 4, unit: 4 },
    bars: 2,
    subdivision: 7,
    tempo: 50,
    voices: ['kick', 'snare', 'hihat', 'hihatFoot'],
    ostinato: { voice: 'hihat', slots: [0, 2, 4, 6] },
    layers: [{ voice: 'hihatFoot', slots: [0], beats: [2, 4] }],
    density: 0.3,
  },
  'mixed grids': {
    meter: { beats: 4, unit: 4 },
    bars: 2,
    subdivision: [3, 5, 6, 8],
    tempo: 60,
    voices: ['kick', 'snare', 'ride', 'crash', 'tomHigh', 'tomMid', 'tomFloor'],
    ostinato: { voice: 'ride', slots: [0], dynamic: 'accent' },
    rules: [{ kind: 'fillHoles', voices: ['snare'], ghost: 0.5, accent: 0.3 }],
    density: 0.5,
  },
  'sixteenth beats': {
    meter: { beats: 3, unit: 16 },
    bars: 2,
    subdivision: [8, 7, 2],
    tempo: 120,
    voices: ['kick', 'snare', 'hihat', 'hihatOpen', 'rim', 'rideBell'],
    ostinato: { voice: 'rideBell', slots: [0] },
    density: 0.5,
    rules: [{ kind: 'fillHoles', voices: ['snare', 'hihat', 'hihatOpen', 'rim'] }],
  },
};

/** Every format card's drill at the seed `formats`. */
export function formatDrills(): [string, Drill][] {
  return Object.entries(FORMAT_CARDS).map(([name, card]) => [
    name,
    generateDrill(parseRuleCard(card), 'formats'),
  ]);
}
