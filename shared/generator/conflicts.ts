import { isHandVoice } from './drill';
import { RuleConflictError } from './errors';
import { positionOf, slotsIn, type Grid } from './grid';
import { assignHands, FOOT_LIMITS, HAND_LIMITS } from './hands';
import type { Obligations } from './obligations';
import { describePart, partKind } from './rules/describe';
import { fillBars, phraseOf } from './rules/phrase';
import { overlapBudget } from './rules/linear';
import type { Placement } from './rules/placement';
import type { RuleCard } from './schema';
import { listWords, positionWords, voiceWord } from './words';

/**
 * Conflicts visible before any fill is chosen: a voice the card does not have, an obligatory hit
 * on an avoided downbeat, more than two hands at once, too many overlaps for a linear rule, or
 * notes too fast for two hands. Throws a RuleConflictError naming the parts in conflict.
 */
export function assertNoObligationConflicts(card: RuleCard, grid: Grid, ob: Obligations): void {
  assertVoicesOnCard(card);
  assertAvoidedDownbeatsFree(card, grid, ob);
  assertLinearBudget(card, grid, ob);
  assertHandsSuffice(card, grid, ob);
  assertPhraseHasRoom(card, grid, ob);
}

/** Every fill bar must have at least one slot the other rules leave to the fill. */
function assertPhraseHasRoom(card: RuleCard, grid: Grid, ob: Obligations): void {
  const phrase = phraseOf(card);
  if (!phrase) return;
  for (const bar of fillBars(phrase.rule, grid.bars)) {
    const from = bar * grid.slotsPerBar;
    const played = ob.placements.some(
      (p) =>
        p.source === 'phrase' &&
        p.instant >= from &&
        p.instant < from + grid.slotsPerBar &&
        ob.inFill[p.instant],
    );
    if (played) continue;
    const others = [
      ...new Set(
        ob.placements
          .filter((p) => p.rule >= 0 && ob.inFill[p.instant] && p.source !== 'phrase')
          .map((p) => p.rule),
      ),
    ];
    throw new RuleConflictError(
      `${capital(describePart(card, phrase.index))} has no room for its fill in bar ${bar + 1}: ${listWords(others.map((r) => describePart(card, r)))} already take${others.length === 1 ? 's' : ''} every slot of its last ${phrase.rule.fillBeats} beat${phrase.rule.fillBeats === 1 ? '' : 's'}. Lengthen the fill or move those rules.`,
      ['phrase', ...others.map((r) => partKind(card, r))].filter(unique),
    );
  }
}

function where(grid: Grid, instant: number): string {
  const p = positionOf(grid, instant);
  return positionWords(p.bar, p.beat, p.slot, slotsIn(grid, p.beat - 1));
}

function assertVoicesOnCard(card: RuleCard): void {
  const onCard = new Set(card.voices);
  const used: [string, number][] = [];
  if (card.ostinato) used.push([card.ostinato.voice, -1]);
  card.rules.forEach((rule, index) => {
    if ('voice' in rule) used.push([rule.voice, index]);
    if ('voices' in rule) for (const v of rule.voices) used.push([v, index]);
  });
  for (const [voice, index] of used) {
    if (onCard.has(voice as never)) continue;
    throw new RuleConflictError(
      `${capital(describePart(card, index))} plays the ${voiceWord(voice)}, but the card's voices (${listWords(card.voices.map(voiceWord))}) do not include it.`,
      [partKind(card, index), 'voices'],
    );
  }
}

function assertAvoidedDownbeatsFree(card: RuleCard, grid: Grid, ob: Obligations): void {
  for (const p of ob.placements) {
    const avoider = ob.avoided.get(p.voice)?.get(p.instant);
    if (avoider === undefined) continue;
    const bar = positionOf(grid, p.instant).bar;
    const sameKind = p.rule !== avoider && partKind(card, p.rule) === 'avoidDownbeat';
    const numbered = (rule: number): string =>
      `${describePart(card, rule)}${sameKind ? ` (rule ${rule + 1})` : ''}`;
    const part = p.rule === avoider ? `the ${voiceWord(p.voice)}'s anticipation` : numbered(p.rule);
    throw new RuleConflictError(
      `${capital(numbered(avoider))} keeps the ${voiceWord(p.voice)} off beat 1 of bar ${bar}, but ${part} puts it there.`,
      [partKind(card, p.rule), 'avoidDownbeat'],
    );
  }
}

function assertLinearBudget(card: RuleCard, grid: Grid, ob: Obligations): void {
  const budget = overlapBudget(card);
  if (!Number.isFinite(budget)) return;
  for (let bar = 0; bar < grid.bars; bar++) {
    let overlaps = 0;
    for (let i = 0; i < grid.slotsPerBar; i++) {
      const instant = bar * grid.slotsPerBar + i;
      const cell = ob.cells[instant] ?? [];
      if (cell.length < 2 || ++overlaps <= budget) continue;
      const [a, b] = cell;
      const allowance =
        budget === 0
          ? 'allows no overlaps'
          : `allows at most ${budget} overlap${budget === 1 ? '' : 's'} a bar`;
      throw new RuleConflictError(
        `The linear rule ${allowance}, but ${describePart(card, b?.rule ?? -1)} lands on ${describePart(card, a?.rule ?? -1)} (${where(grid, instant)}).`,
        ['linear', partKind(card, b?.rule ?? -1), partKind(card, a?.rule ?? -1)].filter(unique),
      );
    }
  }
}

function assertHandsSuffice(card: RuleCard, grid: Grid, ob: Obligations): void {
  const failure = assignHands(card, grid, ob.cells);
  if (!failure) return;
  const cell = ob.cells[failure.instant] ?? [];
  const parts = partsNear(ob.placements, failure.instant).map((r) => describePart(card, r));
  const kinds = partsNear(ob.placements, failure.instant).map((r) => partKind(card, r));
  const hands = cell.filter((hit) => isHandVoice(hit.voice)).map((hit) => voiceWord(hit.voice));
  const at = where(grid, failure.instant);
  const singles = `a hand plays single strokes at fewer than ${HAND_LIMITS.singlesPerSecond} a second${card.sticking.doubles ? ` and doubles at up to ${HAND_LIMITS.doublesPerSecond}` : ''}`;
  const message =
    failure.reason === 'tooManyHands'
      ? `At ${at} ${listWords(parts)} need the ${listWords(hands)} at once, but a drummer has only two hands.`
      : failure.reason === 'feet'
        ? `At ${card.tempo} beats per minute, ${listWords(parts)} ask the ${voiceWord(failure.voice ?? 'kick')} to play faster than one foot can around ${at} (single strokes at fewer than ${FOOT_LIMITS.singlesPerSecond} a second, doubles at up to ${FOOT_LIMITS.doublesPerSecond}, never three in a row faster than singles): slow the tempo or thin out the foot part.`
        : failure.reason === 'tooFast'
          ? `At ${card.tempo} beats per minute, ${listWords(parts)} ask the hands for more than they can play around ${at} (${singles}): slow the tempo or thin out the hand parts.`
          : failure.streams
            ? `${capital(listWords(failure.streams))} cannot each keep to one hand: change a voice or thin out one of them.`
            : failure.arms
              ? `Around ${at}, ${listWords(parts)} would cross the arms both ways (the leading hand on its far side of the kit while the other reaches for its own): lead with the other hand (open-handed) or move that part to the snare or the toms.`
              : `Around ${at}, ${listWords(parts)} leave no sticking a teacher would write (the time on the leading hand, figures on one hand, no crossing while the other hand is free, no hand playing three notes of a run while the other waits): change the sticking lead or thin out the hand parts.`;
  throw new RuleConflictError(message, [...kinds, 'hands'].filter(unique));
}

/** Rule indexes of the placements at an instant and just before it (for rate conflicts). */
function partsNear(placements: readonly Placement[], instant: number): number[] {
  const near = placements.filter((p) => p.instant === instant || p.instant === instant - 1);
  return near.map((p) => p.rule).filter(unique);
}

const unique = <T>(value: T, index: number, all: readonly T[]): boolean =>
  all.indexOf(value) === index;
const capital = (text: string): string => text.charAt(0).toUpperCase() + text.slice(1);
