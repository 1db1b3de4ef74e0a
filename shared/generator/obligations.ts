import { VOICE_IDS, type VoiceId } from './drill';
import type { Grid } from './grid';
import type { WorkHit } from './hands';
import { colourCrashes, placeAnchors } from './rules/anchor';
import { planAvoidDownbeat } from './rules/avoid-downbeat';
import { placeBackbeat } from './rules/backbeat';
import { placeEuclid } from './rules/euclid';
import { fillBars, fillWindow, phraseOf, placePhrase, type GivenFill } from './rules/phrase';
import { SOURCE_RANK, type Placement } from './rules/placement';
import { placePolyrhythm } from './rules/polyrhythm';
import { placeTimeLayers } from './rules/time-layers';
import type { RuleCard } from './schema';

/** Everything the card's rules demand before any fill is chosen. */
export interface Obligations {
  /** Every requested hit, in precedence order (ostinato first, then by rule kind and index). */
  readonly placements: readonly Placement[];
  /** Per instant: the merged obligatory hits (one per voice, the first part in precedence wins). */
  readonly cells: WorkHit[][];
  /** Per voice: instants where an avoidDownbeat rule keeps it silent, with that rule's index. */
  readonly avoided: ReadonlyMap<VoiceId, ReadonlyMap<number, number>>;
  /** Per instant: inside a phrase's fill, where no groove fill goes. */
  readonly inFill: readonly boolean[];
}

/**
 * Places every obligatory hit of the card and merges them by precedence: time layers, the
 * rules, the phrase fill (on what the rules leave free), then the anchors (kick on one, colour
 * crash) where nothing keeps them off. The seed varies the phrase's fill (see `placePhrase`); a
 * fill bar `given` (kept, or being checked) keeps the allowed fill it has.
 */
export function collectObligations(
  card: RuleCard,
  grid: Grid,
  seed?: string,
  given?: GivenFill,
): Obligations {
  const inFill = fillWindow(card, grid);
  const crashed = crashInstants(card, grid);
  const placements: Placement[] = placeTimeLayers(card, grid, inFill, crashed);
  const avoided = new Map<VoiceId, Map<number, number>>();
  card.rules.forEach((rule, index) => {
    switch (rule.kind) {
      case 'backbeat':
        placements.push(...placeBackbeat(rule, index, grid));
        break;
      case 'avoidDownbeat': {
        const plan = planAvoidDownbeat(rule, index, grid);
        placements.push(...plan.placements);
        const forVoice = avoided.get(rule.voice) ?? new Map<number, number>();
        for (const instant of plan.avoided)
          if (!forVoice.has(instant)) forVoice.set(instant, index);
        avoided.set(rule.voice, forVoice);
        break;
      }
      case 'polyrhythm':
        placements.push(...placePolyrhythm(rule, index, grid));
        break;
      case 'euclid':
        placements.push(...placeEuclid(rule, index, grid));
        break;
      default:
        break;
    }
  });
  const ruled = new Set<number>();
  for (const p of placements) if (p.source !== 'ostinato') ruled.add(p.instant);
  for (const kept of avoided.values()) for (const instant of kept.keys()) ruled.add(instant);
  const before = voiceCounts(placements, grid);
  placements.push(
    ...placePhrase(
      card,
      grid,
      // The fill leaves out the slots other rules hold and the downbeats kept free.
      (instant) => ruled.has(instant),
      (instant) => before[instant] ?? 0,
      seed,
      given,
    ),
  );
  const cells = merge(placements, grid);
  const anchors = placeAnchors(card, grid, cells, avoided);
  placements.push(...anchors);
  // A crash the hands could not reach leaves the time cymbal where it was.
  const unplayed = [...crashed].filter((i) => !anchors.some((p) => p.instant === i));
  if (unplayed.length > 0 && !phraseOf(card)) {
    const back = placeTimeLayers(card, grid, inFill, new Set());
    placements.push(...back.filter((p) => unplayed.includes(p.instant)));
  }
  sortByPrecedence(placements);
  return { placements, cells: merge(placements, grid), avoided, inFill };
}

/** SOURCE_RANK as a map: faster to read with a source that varies, as the sort does. */
const RANKS: ReadonlyMap<string, number> = new Map(Object.entries(SOURCE_RANK));
const rankOf = (p: Placement): number => RANKS.get(p.source) ?? 0;

/**
 * Stable sort: precedence by source, then the card's rule order. One numeric key a placement
 * (rank, rule, then its index for stability) sorts without a comparator call per step.
 */
function sortByPrecedence(placements: Placement[]): void {
  const n = placements.length;
  const keys = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const p = placements[i] as Placement;
    const rule = p.rule + RULE_OFFSET;
    if (rule < 0 || rule >= RULE_SPAN || n >= INDEX_SPAN) {
      placements.sort((a, b) => rankOf(a) - rankOf(b) || a.rule - b.rule);
      return;
    }
    keys[i] = (rankOf(p) * RULE_SPAN + rule) * INDEX_SPAN + i;
  }
  keys.sort();
  const copy = placements.slice();
  for (let i = 0; i < n; i++) placements[i] = copy[(keys[i] as number) % INDEX_SPAN] as Placement;
}

// Rule indexes run from -4 (kept notes) up; the ranks are below 8, so every key is an integer
// below 2^53.
const RULE_OFFSET = 16;
const RULE_SPAN = 1 << 16;
const INDEX_SPAN = 1 << 20;

/** Per instant: how many voices the placements give it (what `merge` would put in its cell). */
function voiceCounts(placements: readonly Placement[], grid: Grid): Uint8Array {
  const seen = new Uint16Array(grid.instants);
  const counts = new Uint8Array(grid.instants);
  for (const p of placements) {
    if (p.instant < 0 || p.instant >= grid.instants) continue;
    const bit = 1 << (VOICE_BIT.get(p.voice) ?? 0);
    if ((seen[p.instant] as number) & bit) continue;
    seen[p.instant] = (seen[p.instant] as number) | bit;
    counts[p.instant] = (counts[p.instant] as number) + 1;
  }
  return counts;
}

const VOICE_BIT: ReadonlyMap<VoiceId, number> = new Map(VOICE_IDS.map((voice, i) => [voice, i]));

/** Where a crash replaces the time cymbal: the colour crash and each phrase landing's. */
function crashInstants(card: RuleCard, grid: Grid): Set<number> {
  const crashes = colourCrashes(card);
  const phrase = phraseOf(card);
  if (phrase?.rule.crash && card.voices.includes('crash')) {
    for (const bar of fillBars(phrase.rule, grid.bars))
      crashes.add(((bar + 1) % grid.bars) * grid.slotsPerBar);
  }
  return crashes;
}

function merge(placements: readonly Placement[], grid: Grid): WorkHit[][] {
  // A cell's array is made with its first hit: an empty array that is pushed to reserves room
  // for 17, and most of a drill's instants hold none or one.
  const cells: (WorkHit[] | undefined)[] = new Array<WorkHit[] | undefined>(grid.instants);
  for (const p of placements) {
    if (p.instant < 0 || p.instant >= grid.instants) continue;
    const cell = cells[p.instant];
    if (cell && hasVoice(cell, p.voice)) continue;
    const hit = { voice: p.voice, source: p.source, dynamic: p.dynamic, rule: p.rule, hand: null };
    if (cell) cell.push(hit);
    else cells[p.instant] = [hit];
  }
  for (let i = 0; i < grid.instants; i++) cells[i] ??= [];
  return cells as WorkHit[][];
}

function hasVoice(cell: readonly WorkHit[], voice: VoiceId): boolean {
  for (const hit of cell) if (hit.voice === voice) return true;
  return false;
}
