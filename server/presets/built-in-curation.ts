import type { Level } from '../rule-cards/card-fields';

/** A level and tags for a built-in card, given when it first enters the presets table. */
export interface Curation {
  readonly level: Level;
  readonly tags: readonly string[];
}

/**
 * Starting levels and tags of the built-in cards (the admin edits them afterwards). The tag
 * words are the trade's own (common practice). Levels agree with `drillDifficulty` at every seed
 * the spec tries; where they did not, a teacher's view decided (common practice): a backbeat moved
 * a sixteenth off 2 and 4 is a displacement lesson, after the plain backbeat (intermediate); the
 * 12/8 shuffle at a slow blues tempo is among a student's first grooves (beginner); 7/8 as
 * 2+2+3 with a plain eighth-note hi-hat asks for the uneven pulse alone (intermediate).
 */
export const BUILT_IN_CURATION: Readonly<Record<string, Curation>> = {
  'kick-off-the-one': { level: 'beginner', tags: ['displacement', 'release'] },
  'three-off-land-on-four': { level: 'intermediate', tags: ['displacement', 'release'] },
  'early-backbeat': { level: 'intermediate', tags: ['displacement'] },
  'late-backbeat': { level: 'intermediate', tags: ['displacement'] },
  'late-backbeat-over-the-bar-line': { level: 'intermediate', tags: ['displacement'] },
  'ride-with-foot-on-2-and-4': { level: 'beginner', tags: ['groove'] },
  'linear-sixteenths': { level: 'intermediate', tags: ['linear'] },
  'cuban-style-bass': { level: 'intermediate', tags: ['ostinato'] },
  'shuffle-kick-upbeats': { level: 'intermediate', tags: ['shuffle'] },
  'four-over-three': { level: 'advanced', tags: ['polyrhythm'] },
  'quintuplets-hihat-1-3-5': { level: 'advanced', tags: ['odd subdivision'] },
  'quintuplets-hihat-1-3-4': { level: 'advanced', tags: ['odd subdivision'] },
  'euclidean-five-in-sixteen': { level: 'intermediate', tags: ['euclidean', 'polyrhythm'] },
  'tension-and-release': { level: 'intermediate', tags: ['release'] },
  'groove-and-fill': { level: 'beginner', tags: ['fill', 'release'] },
  'six-eight-groove': { level: 'beginner', tags: ['compound meter'] },
  'twelve-eight-shuffle': { level: 'beginner', tags: ['compound meter', 'shuffle'] },
  'seven-eight-two-two-three': { level: 'intermediate', tags: ['odd meter'] },
};
