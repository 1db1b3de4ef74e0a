/**
 * A bar's measured tension in words, so a student reads "syncopated" rather than "0.47". The
 * measure runs from 0 (every onset on a strong position) to 1 (the most syncopated bar the
 * measure knows); the five bands split it evenly. The bands are this app's own reading aid, not a
 * published scale.
 */
export const TENSION_WORDS = [
  'calm',
  'lightly syncopated',
  'syncopated',
  'strongly syncopated',
  'very syncopated',
] as const;

export type TensionWord = (typeof TENSION_WORDS)[number];

/** The band of a tension (values outside 0..1 are read as the nearest end). */
export function tensionWord(tension: number): TensionWord {
  const value = Number.isFinite(tension) ? Math.min(1, Math.max(0, tension)) : 0;
  const index = Math.min(TENSION_WORDS.length - 1, Math.floor(value * TENSION_WORDS.length));
  return TENSION_WORDS[index] ?? 'calm';
}

/** "calm (0–0.2) … very syncopated (0.8–1)": the legend printed under the score. */
export function tensionScaleText(): string {
  const width = 1 / TENSION_WORDS.length;
  return TENSION_WORDS.map((word, i) => {
    const from = i * width;
    return `${word} ${trim(from)}–${trim(from + width)}`;
  }).join(', ');
}

function trim(value: number): string {
  return String(Math.round(value * 10) / 10);
}
