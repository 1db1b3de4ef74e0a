import {
  compareHits,
  HIT_SOURCES,
  isHandVoice,
  VOICE_IDS,
  type DrillBar,
  type DrillHit,
  type VoiceId,
} from './drill';
import { RuleCardError, type RuleCardIssue } from './errors';
import type { Grid } from './grid';
import type { WorkHit } from './hands';
import type { Obligations } from './obligations';
import type { RuleCard } from './schema';
import { listWords, positionWords, voiceWord } from './words';

/** Options of `generateDrill` beyond the card and the seed. */
export interface GenerateOptions {
  /**
   * Bars to keep as they are ("pinned"): each is placed at its own `bar` number, hits and hands
   * exactly as given, and the other bars are generated around it with the seed.
   */
  readonly keep?: readonly DrillBar[];
}

/** Kept bars by 0-based bar index, checked against the card's shape (not yet its rules). */
export type KeptBars = ReadonlyMap<number, DrillBar>;

const DYNAMICS: readonly string[] = ['ghost', 'normal', 'accent'];

/**
 * Reads the kept bars: each on a bar of the card, once, on the card's grid, with hits on the
 * grid, in the card's voices, with a known dynamic and source, hands on hand voices only, at
 * most one hit per voice and two hands at an instant. Throws a RuleCardError naming the bar in
 * a teacher's words. Hits come back sorted as a drill sorts them.
 */
export function readKeptBars(card: RuleCard, grid: Grid, keep: readonly DrillBar[]): KeptBars {
  const out = new Map<number, DrillBar>();
  const issues: RuleCardIssue[] = [];
  const voices = new Set<string>(card.voices);
  const theVoices = listWords(card.voices.map(voiceWord));
  keep.forEach((raw, k) => {
    const path = `keep[${k}]`;
    const fail = (message: string, at = path): void => {
      issues.push({ path: at, message });
    };
    const bar = (raw as { bar?: unknown } | null)?.bar;
    if (typeof bar !== 'number' || !Number.isInteger(bar) || bar < 1 || bar > card.bars) {
      fail(
        `Pinned bar ${String(bar)} is not a bar of this card: it has bars 1 to ${card.bars}.`,
        `${path}.bar`,
      );
      return;
    }
    if (out.has(bar - 1)) {
      fail(`Bar ${bar} is pinned twice.`, `${path}.bar`);
      return;
    }
    const beats = (raw as { beats?: unknown }).beats;
    if (!Array.isArray(beats) || beats.join() !== grid.beats.join()) {
      fail(
        `Pinned bar ${bar} is written on another grid (${Array.isArray(beats) ? beats.join(', ') : 'none'} notes a beat); the card has ${grid.beats.join(', ')}.`,
        `${path}.beats`,
      );
      return;
    }
    const hits = (raw as { hits?: unknown }).hits;
    if (!Array.isArray(hits)) {
      fail(`Pinned bar ${bar} has no list of hits.`, `${path}.hits`);
      return;
    }
    const before = issues.length;
    hits.forEach((hit: unknown, j) => {
      const problem = hitProblem(hit, grid, voices, theVoices);
      if (problem) fail(`Pinned bar ${bar} ${problem}`, `${path}.hits[${j}]`);
    });
    if (issues.length > before) return;
    const sorted = (hits as DrillHit[]).slice().sort(compareHits);
    const clash = instantProblem(sorted, grid, bar);
    if (clash) {
      fail(clash, `${path}.hits`);
      return;
    }
    const tension = (raw as { tension?: unknown }).tension;
    out.set(bar - 1, {
      bar,
      beats: grid.beats.slice(),
      tension: typeof tension === 'number' ? tension : 0,
      hits: sorted.map((h) => ({ ...h })),
    });
  });
  if (issues.length > 0) throw new RuleCardError('invalid_keep', issues);
  return out;
}

/** What is wrong with one kept hit, as the end of a sentence starting "Pinned bar N", or null. */
function hitProblem(
  hit: unknown,
  grid: Grid,
  voices: ReadonlySet<string>,
  theVoices: string,
): string | null {
  if (typeof hit !== 'object' || hit === null) return 'has a hit that is not a note.';
  const h = hit as Record<string, unknown>;
  const voice = h['voice'];
  if (typeof voice !== 'string' || !(VOICE_IDS as readonly string[]).includes(voice))
    return `has a hit on an unknown voice (${String(voice)}).`;
  const word = voiceWord(voice);
  if (!voices.has(voice)) return `has a ${word}, but the card's voices are ${theVoices}.`;
  const beat = h['beat'];
  const slot = h['slot'];
  const slots = typeof beat === 'number' ? grid.beats[beat - 1] : undefined;
  if (
    typeof beat !== 'number' ||
    !Number.isInteger(beat) ||
    slots === undefined ||
    typeof slot !== 'number' ||
    !Number.isInteger(slot) ||
    slot < 0 ||
    slot >= slots
  )
    return `has a ${word} note outside the bar's beats and notes (beat ${String(beat)}, note ${String(slot)}).`;
  if (typeof h['dynamic'] !== 'string' || !DYNAMICS.includes(h['dynamic']))
    return `has a ${word} note with an unknown dynamic (${String(h['dynamic'])}).`;
  if (typeof h['source'] !== 'string' || !(HIT_SOURCES as readonly string[]).includes(h['source']))
    return `has a ${word} note from an unknown part of the card (${String(h['source'])}).`;
  const hand = h['hand'];
  if (isHandVoice(voice as VoiceId)) {
    if (hand !== 'R' && hand !== 'L') return `has a ${word} note with no hand (R or L).`;
  } else if (hand !== null) {
    return `has a ${word} note given to a hand, but the ${word} is played with a foot.`;
  }
  return null;
}

/** Two notes of one voice at an instant, or two on one hand, or three hand notes at once. */
function instantProblem(hits: readonly DrillHit[], grid: Grid, bar: number): string | null {
  for (let k = 0; k < hits.length; k++) {
    const a = hits[k] as DrillHit;
    const at = positionWords(bar, a.beat, a.slot, grid.beats[a.beat - 1] ?? 1);
    const same = hits.filter((b) => b.beat === a.beat && b.slot === a.slot);
    if (same.filter((b) => b.voice === a.voice).length > 1)
      return `Pinned bar ${bar} has the ${voiceWord(a.voice)} twice at ${at}.`;
    const hands = same.filter((b) => b.hand !== null);
    if (hands.length > 2)
      return `Pinned bar ${bar} asks for ${listWords(hands.map((b) => voiceWord(b.voice)))} at once at ${at}, but a drummer has only two hands.`;
    if (hands.length === 2 && hands[0]?.hand === hands[1]?.hand)
      return `Pinned bar ${bar} gives the ${voiceWord(hands[0]?.voice ?? '')} and the ${voiceWord(hands[1]?.voice ?? '')} to one hand at once at ${at}.`;
  }
  return null;
}

/**
 * The obligations with the kept bars in place of what the card alone demands there: the fill,
 * the tension search and the sticking then treat every kept hit as fixed.
 */
export function withKeptBars(ob: Obligations, grid: Grid, kept: KeptBars): Obligations {
  if (kept.size === 0) return ob;
  const cells = ob.cells.map((cell) => cell.slice());
  for (const [b, bar] of kept) {
    for (let i = 0; i < grid.slotsPerBar; i++) cells[b * grid.slotsPerBar + i] = [];
    for (const hit of bar.hits) {
      const instant = b * grid.slotsPerBar + (grid.beatStart[hit.beat - 1] ?? 0) + hit.slot;
      const pinned: WorkHit = {
        voice: hit.voice,
        source: hit.source,
        dynamic: hit.dynamic,
        rule: -4,
        hand: hit.hand,
        pinned: true,
      };
      cells[instant]?.push(pinned);
    }
  }
  return { ...ob, cells };
}
