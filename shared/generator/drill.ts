import type { Difficulty } from './difficulty';
import type { RuleCard } from './schema';

/**
 * The drill: what the engine returns for a rule card and a seed, and what every consumer
 * (notation, playback, PDF, MIDI, MusicXML, seed links, tension plots) reads.
 *
 * Positions are exact: a hit sits at `(beat - 1) + slot / beats[beat - 1]` beats from the start
 * of its bar. Bars and beats count from 1, as a drummer counts; `slot` is 0-based inside the beat.
 */

/** Every voice the engine knows, in plain string order where order matters (hit sorting). */
export const VOICE_IDS = [
  'kick',
  'snare',
  'rim',
  'hihat',
  'hihatOpen',
  'hihatFoot',
  'ride',
  'rideBell',
  'crash',
  'tomHigh',
  'tomMid',
  'tomFloor',
] as const;

export type VoiceId = (typeof VOICE_IDS)[number];

/** Feet: `kick` is the right foot, `hihatFoot` the left; every other voice is played by a hand. */
export const FOOT_VOICES: ReadonlySet<VoiceId> = new Set<VoiceId>(['kick', 'hihatFoot']);

export function isHandVoice(voice: VoiceId): boolean {
  // The two feet of FOOT_VOICES, compared directly: the engine asks this on every note.
  return voice !== 'kick' && voice !== 'hihatFoot';
}

/** Hits at one instant are ordered by voice id, as plain strings. */
export function compareVoices(a: { voice: VoiceId }, b: { voice: VoiceId }): number {
  return a.voice < b.voice ? -1 : a.voice > b.voice ? 1 : 0;
}

/** A bar's hit order: by beat, slot, then voice id. */
export function compareHits(a: DrillHit, b: DrillHit): number {
  return a.beat - b.beat || a.slot - b.slot || compareVoices(a, b);
}

export type Dynamic = 'ghost' | 'normal' | 'accent';
export type Hand = 'R' | 'L';

/** Which part of the card placed a hit; earlier names win when two parts want one instant. */
export const HIT_SOURCES = [
  'ostinato',
  'backbeat',
  'avoidDownbeat',
  'phrase',
  'polyrhythm',
  'euclid',
  'anchor',
  'fill',
] as const;
export type HitSource = (typeof HIT_SOURCES)[number];

export interface DrillHit {
  /** Beat in the bar, counted from 1. */
  readonly beat: number;
  /** 0-based position inside the beat's subdivision. */
  readonly slot: number;
  readonly voice: VoiceId;
  readonly dynamic: Dynamic;
  /** `R` or `L` for hand voices, `null` for feet. */
  readonly hand: Hand | null;
  readonly source: HitSource;
}

export interface DrillBar {
  /** Bar number, counted from 1. */
  readonly bar: number;
  /** Slots per beat, one entry per beat of the meter. */
  readonly beats: readonly number[];
  /** The bar's measured syncopation, 0..1 (see `measureTension`). */
  readonly tension: number;
  /** Sorted by beat, slot, then voice id. */
  readonly hits: readonly DrillHit[];
}

/** A generated drill: the engine version and seed that reproduce it, its card, its bars. */
export interface Drill {
  /** ENGINE_VERSION of the engine that generated it. */
  readonly engine: string;
  readonly seed: string;
  /** The normalised rule card (every default filled in). */
  readonly card: RuleCard;
  /**
   * The calmest and the tensest bar tension this card allows (exact, on the same 0..1 scale as
   * each bar's `tension`): a tension target t aims at least + t × (most − least).
   */
  readonly tensionReach: { readonly least: number; readonly most: number };
  /** `single` when the card leaves no room to vary: every seed gives this same drill. */
  readonly variety: 'single' | 'many';
  /** How demanding the drill is (see `drillDifficulty`). */
  readonly difficulty: Difficulty;
  readonly bars: readonly DrillBar[];
}
