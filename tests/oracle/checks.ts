/**
 * The oracle's checks of one drill against its card. Each check has a name; a finished drill
 * must give no violation of any of them. The only exceptions to "the ostinato (and every layer)
 * plays its slots in every beat of every bar" are the two that docs/engine.md allows: in a phrase's
 * fill window the time layers of hand voices rest, and a phrase's landing crash replaces the time
 * cymbal on its instant (see `rests` in plan.ts).
 */
import {
  isHand,
  rulesOf,
  FAR_SIDE_FOR_LEFT_HAND,
  FAR_SIDE_FOR_RIGHT_HAND,
  type OracleCard,
  type Voice,
} from './card';
import { checkGrooves, GROOVE_CHECKS } from './groove-checks';
import { key, PRECEDENCE, type Plan, type Source } from './plan';
import { measuredTension, measuredWitek } from './tension';

export interface HitLike {
  readonly beat: number;
  readonly slot: number;
  readonly voice: string;
  readonly dynamic: string;
  readonly hand: string | null;
  readonly source: string;
}

export interface BarLike {
  readonly bar: number;
  readonly beats: readonly number[];
  readonly tension: number;
  readonly hits: readonly HitLike[];
}

export interface DrillLike {
  readonly engine: string;
  readonly seed: string;
  readonly card: unknown;
  readonly bars: readonly BarLike[];
}

/** Every check of a drill, by name. */
export const DRILL_CHECKS = [
  'shape/bars',
  'shape/beats',
  'shape/range',
  'shape/order',
  'shape/one-note-per-voice',
  'shape/sources',
  'shape/hands',
  'shape/one-voice-per-hand',
  'shape/at-most-two-hands',
  'card/grid',
  'card/normalised',
  'ostinato',
  'layers',
  'ostinato/rests',
  'source/explained',
  'source/precedence',
  'backbeat',
  'avoidDownbeat/silent',
  'avoidDownbeat/resolve',
  'avoidDownbeat/anticipate',
  'polyrhythm',
  'euclid',
  'linear',
  'fillHoles',
  'fillStep',
  'roles/no-fill-in-time-or-colour',
  'roles/colour-on-landings-only',
  'roles/no-embellishment-on-free-downbeat',
  'roles/embellishment-in-holes',
  'roles/embellishment-dynamics',
  'roles/anchor-on-one',
  'roles/clean-figure',
  'phrase/window',
  'phrase/fill-played',
  'phrase/alternating',
  'phrase/landing-kick',
  'phrase/landing-crash',
  'tension/rank-order',
  'tension/measured',
] as const;

/** The checks for built-in presets, on top of the drill checks. */
export const PRESET_CHECKS = [
  'preset/kick-on-one-at-landings',
  'preset/no-three-in-a-row',
  'preset/no-hand-crossing',
  'preset/no-leap-across-the-kit',
  'preset/ghost-notes-when-asked',
  'preset/ghost-beside-time-on-free-hand',
  'preset/kick-beyond-one',
  'preset/runs-alternate',
  'preset/far-side-on-the-near-hand',
  'preset/backbeat-on-the-free-hand',
  'preset/ghost-notes-on-the-snare',
  'preset/embellishment-only-where-asked',
  'preset/compound-on-its-beats',
  'preset/landing-releases',
  'preset/no-repeated-rule',
  'preset/landing-crash-on-the-leading-hand',
  'preset/fill-does-not-cross-to-the-floor-tom',
  'preset/fill-starts-on-the-leading-hand',
  'preset/fill-goes-round-the-toms',
  'preset/accents-apart-on-one-hand',
  'preset/no-foot-three-in-a-row',
  ...GROOVE_CHECKS,
] as const;

export type CheckName = (typeof DRILL_CHECKS)[number] | (typeof PRESET_CHECKS)[number];

export interface Violation {
  readonly check: CheckName;
  readonly message: string;
}

interface Placed extends HitLike {
  readonly bar: number;
  readonly index: number;
}

/** Hits placed on the oracle's grid; hits off the grid are reported by shape/range and dropped. */
function place(plan: Plan, drill: DrillLike, out: Violation[]): Placed[] {
  const { grid, card } = plan;
  const placed: Placed[] = [];
  for (const bar of drill.bars) {
    for (const hit of bar.hits) {
      const inGrid =
        Number.isInteger(bar.bar) &&
        bar.bar >= 1 &&
        bar.bar <= card.bars &&
        Number.isInteger(hit.beat) &&
        hit.beat >= 1 &&
        hit.beat <= card.beatsPerBar &&
        Number.isInteger(hit.slot) &&
        hit.slot >= 0 &&
        hit.slot < grid.slotsIn(hit.beat);
      if (!inGrid) {
        out.push({
          check: 'shape/range',
          message: `bar ${bar.bar}: ${hit.voice} at beat ${hit.beat} slot ${hit.slot} is off the grid`,
        });
        continue;
      }
      if (!card.voices.includes(hit.voice as Voice))
        out.push({
          check: 'shape/range',
          message: `bar ${bar.bar}: voice ${hit.voice} is not on the card`,
        });
      placed.push({ ...hit, bar: bar.bar, index: grid.index(bar.bar, hit.beat, hit.slot) });
    }
  }
  return placed;
}

const rank = (source: string): number => PRECEDENCE.indexOf(source as Source);

/** Distinct limbs striking at one instant: each foot voice is its own foot, hands by `hand`. */
function limbs(hits: readonly HitLike[]): number {
  const set = new Set<string>();
  for (const h of hits) set.add(isHand(h.voice) ? `hand:${h.hand ?? h.voice}` : `foot:${h.voice}`);
  return set.size;
}

function groupBy<T>(items: readonly T[], by: (t: T) => number): Map<number, T[]> {
  const map = new Map<number, T[]>();
  for (const item of items) {
    const k = by(item);
    const list = map.get(k);
    if (list) list.push(item);
    else map.set(k, [item]);
  }
  return map;
}

/** Every violation of the drill checks. `normalised` compares the engine's echo of the card. */
export function checkDrill(plan: Plan, drill: DrillLike): Violation[] {
  const out: Violation[] = [];
  const { grid, card } = plan;
  const at = (index: number): string => grid.describe(index);

  // ---- shape ----
  if (drill.bars.length !== card.bars || drill.bars.some((b, i) => b.bar !== i + 1))
    out.push({
      check: 'shape/bars',
      message: `bars numbered ${drill.bars.map((b) => b.bar).join(',')}, expected 1..${card.bars}`,
    });
  for (const bar of drill.bars) {
    if (JSON.stringify(bar.beats) !== JSON.stringify(card.subs))
      out.push({
        check: 'shape/beats',
        message: `bar ${bar.bar} has beats ${JSON.stringify(bar.beats)}, the card's subdivision gives ${JSON.stringify(card.subs)}`,
      });
    for (let i = 1; i < bar.hits.length; i++) {
      const a = bar.hits[i - 1]!;
      const b = bar.hits[i]!;
      const ordered =
        a.beat < b.beat ||
        (a.beat === b.beat && (a.slot < b.slot || (a.slot === b.slot && a.voice <= b.voice)));
      if (!ordered)
        out.push({
          check: 'shape/order',
          message: `bar ${bar.bar}: ${a.voice} ${a.beat}.${a.slot} listed before ${b.voice} ${b.beat}.${b.slot}`,
        });
    }
  }
  const hits = place(plan, drill, out);
  const byIndex = groupBy(hits, (h) => h.index);
  const byKey = new Map<string, Placed>();
  for (const h of hits) {
    const k = key(h.voice, h.index);
    if (byKey.has(k))
      out.push({
        check: 'shape/one-note-per-voice',
        message: `${h.voice} twice at ${at(h.index)}`,
      });
    else byKey.set(k, h);
    if (rank(h.source) < 0)
      out.push({
        check: 'shape/sources',
        message: `unknown source "${h.source}" at ${at(h.index)}`,
      });
    const handOk = isHand(h.voice) ? h.hand === 'R' || h.hand === 'L' : h.hand === null;
    if (!handOk)
      out.push({
        check: 'shape/hands',
        message: `${h.voice} at ${at(h.index)} has hand ${JSON.stringify(h.hand)}`,
      });
  }
  for (const [index, group] of byIndex) {
    const hands = group.filter((h) => isHand(h.voice));
    if (hands.length > 2)
      out.push({
        check: 'shape/at-most-two-hands',
        message: `${hands.map((h) => h.voice).join(', ')} at once at ${at(index)}`,
      });
    for (const side of ['R', 'L'])
      if (hands.filter((h) => h.hand === side).length > 1)
        out.push({
          check: 'shape/one-voice-per-hand',
          message: `${hands
            .filter((h) => h.hand === side)
            .map((h) => h.voice)
            .join(' and ')} both in hand ${side} at ${at(index)}`,
        });
  }

  // ---- the card as the engine echoes it ----
  for (const message of plan.offGrid) out.push({ check: 'card/grid', message });
  out.push(...checkNormalised(card, drill.card));

  // ---- every fixed note present ----
  const crashAt = (index: number): boolean => byKey.has(key('crash', index));
  for (const want of plan.wants) {
    const k = key(want.voice, want.index);
    if (plan.yields.has(k) && crashAt(want.index)) {
      // The crash takes the layer's note; a note a rule puts on the same cymbal stays.
      if (byKey.get(k)?.source === 'ostinato')
        out.push({
          check: 'ostinato/rests',
          message: `the ${want.voice} plays with the colour crash at ${at(want.index)}, which replaces it`,
        });
      continue;
    }
    if (!byKey.has(k))
      out.push({
        check: want.check as CheckName,
        message: `${want.voice} missing at ${at(want.index)} (${want.why})`,
      });
  }
  for (const h of hits)
    if (h.source === 'ostinato' && plan.rests.has(key(h.voice, h.index)))
      out.push({
        check: 'ostinato/rests',
        message: `the ${h.voice} time layer plays at ${at(h.index)}, where docs/engine.md has it rest (phrase fill window or crash landing)`,
      });
  for (const s of plan.silent) {
    const hit = byKey.get(key(s.voice, s.index));
    if (hit)
      out.push({
        check: 'avoidDownbeat/silent',
        message: `${s.voice} (source ${hit.source}) on the avoided downbeat ${at(s.index)} (${s.why})`,
      });
  }

  // ---- every source explained, precedence kept ----
  const phrase = rulesOf(card, 'phrase')[0];
  for (const h of hits) {
    const wanted = plan.wantedBy.get(key(h.voice, h.index)) ?? [];
    const fixed = ['ostinato', 'backbeat', 'avoidDownbeat', 'polyrhythm', 'euclid'];
    let explained = true;
    if (fixed.includes(h.source)) explained = wanted.some((w) => w.part === h.source);
    else if (h.source === 'phrase')
      explained =
        wanted.some((w) => w.part === 'phrase') ||
        (plan.fillWindow.has(h.index) &&
          isHand(h.voice) &&
          phrase !== undefined &&
          phrase.voices.includes(h.voice as Voice));
    else if (h.source === 'anchor') {
      const role = card.roles.get(h.voice as Voice);
      explained = (role === 'anchor' || role === 'colour') && h.index === grid.downbeat(h.bar);
    }
    if (!explained)
      out.push({
        check: 'source/explained',
        message: `${h.voice} at ${at(h.index)} has source ${h.source}, but no such part of the card places it there`,
      });
    const yielded = plan.yields.has(key(h.voice, h.index)) && byKey.has(key('crash', h.index));
    const first = Math.min(
      PRECEDENCE.length,
      ...wanted.filter((w) => !(yielded && w.part === 'ostinato')).map((w) => rank(w.part)),
    );
    if (rank(h.source) >= 0 && first < rank(h.source))
      out.push({
        check: 'source/precedence',
        message: `${h.voice} at ${at(h.index)} is named ${h.source}, but ${PRECEDENCE[first]} comes first and wants it`,
      });
  }

  // ---- linear ----
  const byBar = groupBy(hits, (h) => h.bar);
  for (const rule of rulesOf(card, 'linear'))
    for (const [bar, barHits] of byBar) {
      const instants = [...groupBy(barHits, (h) => h.index)].filter(([, g]) => limbs(g) >= 2);
      if (instants.length > rule.maxOverlaps)
        out.push({
          check: 'linear',
          message: `bar ${bar}: ${instants.length} instants with two or more limbs (${instants
            .map(([i]) => at(i))
            .join('; ')}), linear allows ${rule.maxOverlaps}`,
        });
    }

  // ---- fillHoles and roles ----
  const ostinatoPlays = (index: number): boolean =>
    card.ostinato !== null &&
    (plan.wantedBy.get(key(card.ostinato.voice, index)) ?? []).some((w) => w.part === 'ostinato');
  const fillHolesVoices = new Set(rulesOf(card, 'fillHoles').flatMap((r) => r.voices));
  const accentAsked = new Set(
    rulesOf(card, 'fillHoles')
      .filter((r) => r.accent > 0)
      .flatMap((r) => r.voices),
  );
  for (const h of hits) {
    const role = card.roles.get(h.voice as Voice);
    if (h.source === 'fill') {
      const step = card.fillStep.get(h.voice as Voice) ?? 1;
      if (h.slot % step !== 0)
        out.push({
          check: 'fillStep',
          message: `fill ${h.voice} at ${at(h.index)}, between its fill steps (every ${step} slots)`,
        });
      if (fillHolesVoices.has(h.voice as Voice) && ostinatoPlays(h.index))
        out.push({
          check: 'fillHoles',
          message: `fill ${h.voice} at ${at(h.index)}, where the ostinato plays`,
        });
      if (role === 'time' || role === 'colour')
        out.push({
          check: 'roles/no-fill-in-time-or-colour',
          message: `fill ${h.voice} (role ${role}) at ${at(h.index)}`,
        });
      if (role === 'embellishment') {
        if (plan.freeDownbeats.has(h.index))
          out.push({
            check: 'roles/no-embellishment-on-free-downbeat',
            message: `fill ${h.voice} at ${at(h.index)}, a downbeat an avoidDownbeat rule keeps free`,
          });
        if (ostinatoPlays(h.index))
          out.push({
            check: 'roles/embellishment-in-holes',
            message: `fill ${h.voice} at ${at(h.index)}, where the ostinato plays`,
          });
        const dynamicOk =
          h.dynamic === 'accent'
            ? accentAsked.has(h.voice as Voice)
            : h.dynamic === 'ghost' || fillHolesVoices.has(h.voice as Voice);
        if (!dynamicOk)
          out.push({
            check: 'roles/embellishment-dynamics',
            message: `fill ${h.voice} at ${at(h.index)} is ${h.dynamic}; embellishments are ghost notes unless a fillHoles rule asks (accents only where it asks)`,
          });
      }
    }
    if (role === 'colour') {
      const onLanding =
        h.index === grid.downbeat(h.bar) && (h.bar === 1 || plan.landingBars.has(h.bar));
      if (!onLanding)
        out.push({
          check: 'roles/colour-on-landings-only',
          message: `${h.voice} (colour) at ${at(h.index)} (source ${h.source}); colour plays beat 1 of bar 1 and of phrase landings only`,
        });
    }
    if (plan.figureVoices.has(h.voice as Voice) && (h.source === 'fill' || h.source === 'anchor'))
      out.push({
        check: 'roles/clean-figure',
        message: `${h.voice} plays a euclid/polyrhythm figure but has a ${h.source} note at ${at(h.index)}`,
      });
  }
  out.push(...checkAnchors(plan, byIndex, byKey));

  // ---- phrase ----
  if (phrase) {
    for (const h of hits)
      if (
        h.source === 'phrase' &&
        !(plan.wantedBy.get(key(h.voice, h.index)) ?? []).some((w) => w.part === 'phrase') &&
        !plan.fillWindow.has(h.index)
      )
        out.push({
          check: 'phrase/window',
          message: `phrase note ${h.voice} at ${at(h.index)}, outside the fill window and the landing`,
        });
    for (const bar of plan.fillBars) {
      const run = hits
        .filter((h) => h.source === 'phrase' && h.bar === bar && plan.fillWindow.has(h.index))
        .sort((a, b) => a.index - b.index || (a.hand ?? '').localeCompare(b.hand ?? ''));
      if (run.length === 0)
        out.push({
          check: 'phrase/fill-played',
          message: `bar ${bar} ends a ${phrase.every}-bar phrase but its last ${phrase.fillBeats} beat(s) hold no fill`,
        });
      // The hands alternate through the fill window, the notes other rules leave in it included
      // (a backbeat inside the fill is one stroke of the run); instants with both hands are
      // skipped, and alternation is asked of neighbouring slots only (a gap lets a hand rest).
      const strokes = [
        ...groupBy(
          hits.filter((h) => h.hand !== null && h.bar === bar && plan.fillWindow.has(h.index)),
          (h) => h.index,
        ),
      ]
        .filter(([, g]) => g.filter((h) => h.hand !== null).length === 1)
        .map(([index, g]) => {
          const stroke = g.find((h) => h.hand !== null)!;
          // A line's note (euclid, polyrhythm) keeps the hand its line needs (docs/engine.md).
          return {
            index,
            hand: stroke.hand,
            line: ['euclid', 'polyrhythm'].includes(stroke.source),
          };
        })
        .sort((a, b) => a.index - b.index);
      // Runs are notes at 4 a second or faster (docs/engine.md, "Sticking"); slower notes may
      // stay on one hand.
      const runs = (i: number): boolean => grid.notesPerMinuteAt(i, card.tempo) >= 240;
      // Between two line notes whose hands leave the wrong parity, one repeat is unavoidable:
      // each stretch of fill strokes may repeat a hand once if lines bound it on both sides.
      if (!card.doubles) {
        let repeats: [number, number][] = [];
        // A line note just before the window bounds the first stretch too.
        const windowStart = Math.min(...[...plan.fillWindow].filter((i) => grid.barOf(i) === bar));
        const lineBefore = (byIndex.get(windowStart - 1) ?? []).some(
          (h) => h.hand !== null && ['euclid', 'polyrhythm'].includes(h.source),
        );
        let boundedBefore = false;
        const close = (boundedAfter: boolean): void => {
          const allowed = boundedBefore && boundedAfter ? 1 : 0;
          if (repeats.length > allowed)
            for (const [a, b] of repeats)
              out.push({
                check: 'phrase/alternating',
                message: `bar ${bar}: fill strokes at ${at(a)} and ${at(b)} both in hand ${strokes.find((x) => x.index === b)!.hand} (runs alternate single strokes)`,
              });
          repeats = [];
        };
        for (let i = 0; i < strokes.length; i++) {
          const s1 = strokes[i]!;
          const s0 = strokes[i - 1];
          const adjacent = s0 !== undefined && s1.index === s0.index + 1 && runs(s0.index);
          if (!adjacent) {
            close(false);
            boundedBefore = s1.line || (s1.index === windowStart && lineBefore);
            continue;
          }
          if (s1.line) {
            close(true);
            boundedBefore = true;
            continue;
          }
          if (!s0.line && s1.hand === s0.hand) repeats.push([s0.index, s1.index]);
        }
        close(false);
      }
    }
  }

  // ---- each bar's stored tension against the oracle's own measure of the card's kind ----
  for (const bar of drill.bars) {
    const mine = card.measure === 'lhl' ? measuredTension(plan, bar) : measuredWitek(plan, bar);
    if (mine !== bar.tension)
      out.push({
        check: 'tension/measured',
        message: `bar ${bar.bar} stores tension ${bar.tension}; the oracle's ${card.measure === 'lhl' ? 'Longuet-Higgins & Lee' : 'Witek'} measure gives ${mine}`,
      });
  }

  // ---- tension rank order (the drill's own stored values) ----
  if (plan.targets)
    for (let i = 0; i < drill.bars.length; i++)
      for (let j = 0; j < drill.bars.length; j++) {
        const ti = plan.targets[i];
        const tj = plan.targets[j];
        const a = drill.bars[i]!;
        const b = drill.bars[j]!;
        // Strict, as docs/engine.md reads the rank order: a higher target measures more tense.
        if (ti !== undefined && tj !== undefined && ti > tj && a.tension <= b.tension)
          out.push({
            check: 'tension/rank-order',
            message: `bar ${a.bar} (target ${ti}) measures ${a.tension}, not above bar ${b.bar} (target ${tj}) at ${b.tension}`,
          });
      }
  return out;
}

/**
 * An anchor voice plays beat 1 of every bar unless an avoidDownbeat rule keeps it off, the linear
 * budget forbids it, or a euclid/polyrhythm rule plays the voice (docs/engine.md, "Voice roles").
 *
 * The linear budget forbids the anchor only when the notes the card places (fills aside: they
 * rank below the anchor; other anchors and colour count) already use the bar's whole budget
 * elsewhere and a note of another limb stands on the downbeat, so the anchor would add one more
 * overlap.
 */
function checkAnchors(
  plan: Plan,
  byIndex: ReadonlyMap<number, readonly Placed[]>,
  byKey: ReadonlyMap<string, Placed>,
): Violation[] {
  const out: Violation[] = [];
  const { grid, card } = plan;
  const linear = rulesOf(card, 'linear');
  const budget = linear.length ? Math.min(...linear.map((r) => r.maxOverlaps)) : Infinity;
  for (const [voice, role] of card.roles) {
    if (role !== 'anchor' || plan.figureVoices.has(voice)) continue;
    for (let bar = 1; bar <= card.bars; bar++) {
      const down = grid.downbeat(bar);
      if (byKey.has(key(voice, down))) continue;
      if (plan.silent.some((s) => s.voice === voice && s.index === down)) continue;
      const placedByRules = (i: number): readonly Placed[] =>
        (byIndex.get(i) ?? []).filter((h) => h.voice !== voice && h.source !== 'fill');
      const others = placedByRules(down);
      let overlapsElsewhere = 0;
      for (let i = grid.downbeat(bar) + 1; i < grid.downbeat(bar) + grid.slotsPerBar; i++)
        if (limbs(placedByRules(i)) >= 2) overlapsElsewhere += 1;
      const forbidden = limbs(others) === 1 && overlapsElsewhere >= budget;
      if (!forbidden)
        out.push({
          check: 'roles/anchor-on-one',
          message: `${voice} (anchor) missing on beat 1 of bar ${bar}; no avoidDownbeat rule, linear budget or euclid/polyrhythm line keeps it off`,
        });
    }
  }
  return out;
}

/** The normalised card lists every voice's role and fills the documented rule defaults. */
function checkNormalised(card: OracleCard, echoed: unknown): Violation[] {
  const out: Violation[] = [];
  const e = (echoed ?? {}) as {
    roles?: Record<string, string>;
    rules?: Record<string, unknown>[];
    meter?: { grouping?: number[] };
  };
  if (JSON.stringify(e.meter?.grouping ?? null) !== JSON.stringify(card.grouping))
    out.push({
      check: 'card/normalised',
      message: `the normalised meter is grouped ${JSON.stringify(e.meter?.grouping ?? null)}; docs/engine.md gives ${JSON.stringify(card.grouping)}`,
    });
  for (const voice of card.voices) {
    const got = e.roles?.[voice];
    if (got !== card.roles.get(voice))
      out.push({
        check: 'card/normalised',
        message: `the normalised card gives ${voice} the role ${String(got)}; docs/engine.md gives ${card.roles.get(voice)}`,
      });
  }
  card.rules.forEach((rule, i) => {
    const got = e.rules?.[i] ?? {};
    const expect: Record<string, unknown> = {};
    if (rule.kind === 'polyrhythm' || rule.kind === 'euclid') expect['span'] = rule.span;
    if (rule.kind === 'avoidDownbeat') expect['landing'] = rule.landing;
    if (rule.kind === 'phrase') {
      expect['fillBeats'] = rule.fillBeats;
      expect['voices'] = rule.voices;
      expect['crash'] = rule.crash;
    }
    for (const [field, value] of Object.entries(expect))
      if (JSON.stringify(got[field]) !== JSON.stringify(value))
        out.push({
          check: 'card/normalised',
          message: `rule ${i + 1} (${rule.kind}) normalises ${field} to ${JSON.stringify(got[field])}; expected ${JSON.stringify(value)}`,
        });
  });
  return out;
}

/** The preset checks (on top of `checkDrill`). */
export function checkPreset(plan: Plan, drill: DrillLike): Violation[] {
  const out: Violation[] = [];
  const { grid, card } = plan;
  const hits: Placed[] = [];
  for (const bar of drill.bars)
    for (const h of bar.hits)
      if (h.beat >= 1 && h.beat <= card.beatsPerBar && h.slot >= 0 && h.slot < grid.slotsIn(h.beat))
        hits.push({ ...h, bar: bar.bar, index: grid.index(bar.bar, h.beat, h.slot) });
  const byIndex = groupBy(hits, (h) => h.index);

  // A kick on one in every landing bar: phrase landings and the resolution bars of kick
  // avoidDownbeat rules.
  if (card.voices.includes('kick')) {
    const landings = new Set<number>([
      ...plan.landingBars,
      ...(plan.resolutionBars.get('kick') ?? []),
    ]);
    for (const bar of [...landings].sort((a, b) => a - b))
      if (!(byIndex.get(grid.downbeat(bar)) ?? []).some((h) => h.voice === 'kick'))
        out.push({
          check: 'preset/kick-on-one-at-landings',
          message: `no kick on beat 1 of bar ${bar}, a landing/resolution bar`,
        });
  }

  // No hand plays three consecutive notes of the grid when the grid runs at least as fast as
  // sixteenths at 120 BPM (8 notes a second: a slot lasts at most 1/8 s, i.e. tempo × slots ≥ 480
  // a minute), unless the card asks for doubles. Issue 8, "Tests"; drills loop, so the check
  // wraps from the last slot to the first.
  if (!card.doubles) {
    const fast = (i: number): boolean => grid.notesPerMinuteAt(i, card.tempo) >= 480;
    const plays = (i: number, side: string): boolean =>
      (byIndex.get(((i % grid.totalSlots) + grid.totalSlots) % grid.totalSlots) ?? []).some(
        (h) => h.hand === side,
      );
    for (let i = 0; i < grid.totalSlots; i++)
      for (const side of ['R', 'L'])
        if (fast(i) && fast(i + 1) && plays(i, side) && plays(i + 1, side) && plays(i + 2, side))
          out.push({
            check: 'preset/no-three-in-a-row',
            message: `hand ${side} plays three grid notes in a row from ${grid.describe(i)} at ${card.tempo} BPM`,
          });
  }

  // No hand crossing: for a right-handed player the left hand does not go to the ride or the
  // floor tom while the right hand is free, i.e. when the right hand strikes nowhere from the
  // left hand's stroke before to its stroke after (it could have taken the note); mirrored for a
  // left-handed player (docs/engine.md, "Sticking"; the kit layout is common practice). Time and
  // figure notes (ostinato, polyrhythm, euclid lines) keep the hand their line needs.
  const crossing = card.hand === 'right' ? 'L' : 'R';
  const other = card.hand === 'right' ? 'R' : 'L';
  const strokesOf = (side: string): number[] =>
    [...byIndex]
      .filter(([, g]) => g.some((h) => h.hand === side))
      .map(([i]) => i)
      .sort((a, b) => a - b);
  const mine = strokesOf(crossing);
  const theirs = strokesOf(other);
  const n = grid.totalSlots;
  const between = (from: number, to: number): boolean =>
    theirs.some((t) => (to >= from ? t >= from && t <= to : t >= from || t <= to));
  for (const [index, group] of byIndex)
    for (const h of group) {
      if (h.hand !== crossing || !FAR_SIDE_FOR_LEFT_HAND.has(h.voice)) continue;
      if (['ostinato', 'polyrhythm', 'euclid'].includes(h.source)) continue;
      if (group.some((g) => g.hand === other)) continue;
      const k = mine.indexOf(index);
      const before = mine[(k - 1 + mine.length) % mine.length]!;
      const after = mine[(k + 1) % mine.length]!;
      const covered = mine.length > 1 && (between(before, index) || between(index, after));
      if (!covered || n === 0)
        out.push({
          check: 'preset/no-hand-crossing',
          message: `hand ${crossing} crosses to ${h.voice} at ${grid.describe(index)} while hand ${other} is free`,
        });
    }

  // No leap across the kit: one hand does not go from the hi-hat side to the floor tom and ride
  // side (or back) between two consecutive grid notes of a run (4 notes a second or more, as
  // docs/engine.md reads a run), time notes included: there is no time to travel the width of
  // the kit (common practice).
  const leftSide = card.hand === 'right' ? FAR_SIDE_FOR_RIGHT_HAND : FAR_SIDE_FOR_LEFT_HAND;
  const rightSide = card.hand === 'right' ? FAR_SIDE_FOR_LEFT_HAND : FAR_SIDE_FOR_RIGHT_HAND;
  const sideOf = (voice: string): number =>
    leftSide.has(voice) ? -1 : rightSide.has(voice) ? 1 : 0;
  for (let i = 0; i < n; i++) {
    const j = (i + 1) % n;
    if (grid.notesPerMinuteAt(i, card.tempo) < 240) continue;
    for (const side of ['R', 'L'])
      for (const a of byIndex.get(i) ?? [])
        for (const b of byIndex.get(j) ?? [])
          if (a.hand === side && b.hand === side && sideOf(a.voice) * sideOf(b.voice) < 0)
            out.push({
              check: 'preset/no-leap-across-the-kit',
              message: `hand ${side} leaps from the ${a.voice} at ${grid.describe(i)} to the ${b.voice} at the next note`,
            });
  }

  // Ghost notes where the card asks for them: a fillHoles rule with a ghost share puts some
  // in every drill (docs/engine.md, "Voice roles": embellishments are ghost notes by default).
  const asked = rulesOf(card, 'fillHoles').filter((r) => r.ghost > 0);
  if (asked.length > 0 && !hits.some((h) => h.dynamic === 'ghost' && h.source === 'fill'))
    out.push({
      check: 'preset/ghost-notes-when-asked',
      message: `no ghost note in the drill, though fillHoles asks for ghost notes on ${asked.flatMap((r) => r.voices).join(', ')}`,
    });

  // A ghost note right beside a note of the time is played by the free hand: the hand keeping
  // time stays on its cymbal and the other hand plays the ghost notes (common practice), unless
  // the other hand is busy at that instant or plays both neighbouring notes, or the two notes on
  // one side of it (it would play three in a row; runs alternate, see preset/runs-alternate).
  const timeHand = card.lead === 'alternate' ? null : card.lead === 'right' ? 'R' : 'L';
  if (timeHand && card.ostinato && isHand(card.ostinato.voice)) {
    const freeHand = timeHand === 'R' ? 'L' : 'R';
    const timeAt = (i: number): boolean =>
      (byIndex.get(((i % n) + n) % n) ?? []).some(
        (h) => h.source === 'ostinato' && h.hand === timeHand,
      );
    const freeAt = (i: number): boolean =>
      (byIndex.get(((i % n) + n) % n) ?? []).some((h) => h.hand === freeHand);
    for (const h of hits) {
      if (h.dynamic !== 'ghost' || h.source !== 'fill' || h.hand !== timeHand) continue;
      if (!timeAt(h.index - 1) && !timeAt(h.index + 1)) continue;
      if (freeAt(h.index) || (freeAt(h.index - 1) && freeAt(h.index + 1))) continue;
      if (freeAt(h.index - 2) && freeAt(h.index - 1)) continue;
      if (freeAt(h.index + 1) && freeAt(h.index + 2)) continue;
      out.push({
        check: 'preset/ghost-beside-time-on-free-hand',
        message: `ghost ${h.voice} at ${grid.describe(h.index)} on the time hand ${timeHand}, right beside its ${card.ostinato.voice}`,
      });
    }
  }

  // Runs alternate (common practice): where the grid runs at 4 notes a second or more
  // (sixteenths from 60 BPM; docs/engine.md calls that a run), no hand plays three grid notes in
  // a row, whether or not the other hand strikes beside the middle one (L L L snare with the
  // hi-hat on R under the middle L is still three in a row for the left hand), unless the card
  // asks for doubles or all three are notes of a line one hand keeps (the time, a figure).
  if (!card.doubles) {
    const line = (h: HitLike): boolean => ['ostinato', 'polyrhythm', 'euclid'].includes(h.source);
    const at = (i: number): Placed[] => byIndex.get(((i % n) + n) % n) ?? [];
    const runAt = (i: number): boolean => grid.notesPerMinuteAt(i, card.tempo) >= 240;
    if (n >= 3)
      for (let i = 0; i < n; i++)
        for (const side of ['R', 'L']) {
          const three = [at(i), at(i + 1), at(i + 2)].map((g) => g.find((h) => h.hand === side));
          if (!runAt(i) || !runAt(i + 1) || three.some((h) => !h)) continue;
          if (three.every((h) => line(h!))) continue;
          out.push({
            check: 'preset/runs-alternate',
            message: `hand ${side} plays three grid notes in a row from ${grid.describe(i)} at ${card.tempo} BPM`,
          });
        }
  }

  // A note on a hand's far side of the kit (the floor tom or ride for the left hand of a
  // right-handed player) goes to the near hand whenever that hand is free: the crossing hand may
  // take it only while the near hand strikes at the same instant, or hand to hand inside a run
  // that the near hand carries on on that side (the near hand at the grid note just before it,
  // and on that side at the grid note just after it: the L of R L R on the floor tom, or of
  // tom R, floor L, floor R going round the kit), or at a fill's last stroke when the near hand
  // struck the note before and plays the phrase's landing (the crash) at the next grid note: a
  // fill alternates R L to its end and the leading hand comes off it onto the crash, so the
  // near hand is never free there (common practice). Time and figure notes keep the hand their
  // line needs.
  for (const side of ['R', 'L'] as const) {
    const near = side === 'R' ? 'L' : 'R';
    const rightHandSide = card.hand === 'right' ? FAR_SIDE_FOR_LEFT_HAND : FAR_SIDE_FOR_RIGHT_HAND;
    const leftHandSide = card.hand === 'right' ? FAR_SIDE_FOR_RIGHT_HAND : FAR_SIDE_FOR_LEFT_HAND;
    const farSide = side === 'R' ? leftHandSide : rightHandSide;
    const at = (i: number): Placed[] => byIndex.get(((i % n) + n) % n) ?? [];
    const runFrom = (i: number): boolean =>
      grid.notesPerMinuteAt(((i % n) + n) % n, card.tempo) >= 240;
    const nearBefore = (i: number): boolean =>
      runFrom(i - 1) && at(i - 1).some((h) => h.hand === near);
    const nearAfter = (i: number): boolean =>
      runFrom(i) && at(i + 1).some((h) => h.hand === near && farSide.has(h.voice));
    const landsAfter = (h: Placed): boolean =>
      h.source === 'phrase' &&
      runFrom(h.index) &&
      at(h.index + 1).some(
        (g) =>
          g.hand === near &&
          g.source === 'phrase' &&
          plan.landingBars.has(g.bar) &&
          g.index === grid.downbeat(g.bar),
      );
    for (const h of hits) {
      if (h.hand !== side || !farSide.has(h.voice)) continue;
      if (['ostinato', 'polyrhythm', 'euclid'].includes(h.source)) continue;
      if (at(h.index).some((g) => g.hand === near)) continue;
      if (nearBefore(h.index) && (nearAfter(h.index) || landsAfter(h))) continue;
      out.push({
        check: 'preset/far-side-on-the-near-hand',
        message: `hand ${side} crosses to the ${h.voice} at ${grid.describe(h.index)} while hand ${near} is free`,
      });
    }
  }

  // A backbeat goes to the hand the time leaves free (common practice: the right hand rides the
  // hi-hat, the left plays the snare on 2 and 4), wherever the backbeat is moved to; a voice on
  // the free hand's far side is left to the crossing check, and in a phrase's fill window the
  // time rests, so both hands are free and the fill's sticking rules. The one exception: the free
  // hand accents within half a second of it, so the backbeat would be its second accent in a row
  // (preset/no-accent-after-accent-on-one-hand: the late backbeat on the "&" of 1 right before
  // the one on 2).
  if (timeHand && card.ostinato && isHand(card.ostinato.voice)) {
    const freeHand = timeHand === 'R' ? 'L' : 'R';
    const seconds = (from: number, to: number): number => {
      let t = 0;
      for (let i = from; i !== to; i = (i + 1) % n) t += 60 / grid.notesPerMinuteAt(i, card.tempo);
      return t;
    };
    const freeAccentBeside = (index: number): boolean =>
      hits.some(
        (g) =>
          g.hand === freeHand &&
          g.dynamic === 'accent' &&
          g.index !== index &&
          Math.min(seconds(g.index, index), seconds(index, g.index)) < 0.5 - 1e-9,
      );
    const farForFree =
      (freeHand === 'L') === (card.hand === 'right')
        ? FAR_SIDE_FOR_LEFT_HAND
        : FAR_SIDE_FOR_RIGHT_HAND;
    for (const h of hits)
      if (
        h.source === 'backbeat' &&
        !plan.fillWindow.has(h.index) &&
        isHand(h.voice as Voice) &&
        h.voice !== card.ostinato.voice &&
        !farForFree.has(h.voice) &&
        h.hand !== freeHand &&
        !freeAccentBeside(h.index)
      )
        out.push({
          check: 'preset/backbeat-on-the-free-hand',
          message: `backbeat ${h.voice} at ${grid.describe(h.index)} on ${h.hand}, the hand keeping the ${card.ostinato.voice}`,
        });
  }

  // Ghost notes belong on the snare (common practice): a tom is not played as a ghost note.
  for (const h of hits)
    if (h.dynamic === 'ghost' && /^tom/.test(h.voice))
      out.push({
        check: 'preset/ghost-notes-on-the-snare',
        message: `ghost note on the ${h.voice} at ${grid.describe(h.index)}`,
      });

  // The kick is more than a downbeat marker: it plays somewhere besides beat 1 in every drill,
  // and in every bar of a linear groove, where it is one of the voices sharing the line (common
  // practice).
  if (card.voices.includes('kick')) {
    const offOne = (h: Placed): boolean => h.voice === 'kick' && h.index !== grid.downbeat(h.bar);
    if (!hits.some(offOne))
      out.push({
        check: 'preset/kick-beyond-one',
        message: 'the kick plays nothing but beat 1 in the whole drill',
      });
    if (rulesOf(card, 'linear').length > 0)
      for (let bar = 1; bar <= card.bars; bar++)
        if (!hits.some((h) => h.bar === bar && offOne(h)))
          out.push({
            check: 'preset/kick-beyond-one',
            message: `bar ${bar} of a linear groove has the kick on beat 1 only`,
          });
  }

  // Embellishments only where the card asks: a fill note (density or fillHoles, not a phrase)
  // belongs to a voice a fillHoles rule lists, or is an anchor (the kick) at its own strength;
  // no voice gets ghost notes the card never asked for (docs/engine.md, "Voice roles"; common
  // practice: a written groove has no ghost notes unless the teacher adds them).
  const listed = new Set(rulesOf(card, 'fillHoles').flatMap((r) => r.voices));
  for (const h of hits) {
    if (h.source !== 'fill' || listed.has(h.voice as Voice)) continue;
    if (card.roles.get(h.voice as Voice) === 'anchor' && h.dynamic !== 'ghost') continue;
    out.push({
      check: 'preset/embellishment-only-where-asked',
      message: `${h.dynamic} ${h.voice} fill note at ${grid.describe(h.index)}, though no fillHoles rule lists the ${h.voice}`,
    });
  }

  // A compound meter (6/8, 12/8: groups of three beats) is played on its beats: every note at
  // full strength on a beat of the meter (the eighths of 6/8), ghost notes between them sparse,
  // at most one per group of three in a bar (common practice: a 6/8 groove is written in
  // eighths, the cymbal on each, kick on one, snare on four).
  if (card.grouping && card.grouping.every((g) => g === 3))
    for (let bar = 1; bar <= card.bars; bar++) {
      const mine = hits.filter((h) => h.bar === bar);
      for (const h of mine)
        if (h.slot !== 0 && h.dynamic !== 'ghost')
          out.push({
            check: 'preset/compound-on-its-beats',
            message: `${h.dynamic} ${h.voice} at ${grid.describe(h.index)}, between the beats of a compound meter`,
          });
      const ghosts = mine.filter((h) => h.dynamic === 'ghost').length;
      if (ghosts > card.grouping.length)
        out.push({
          check: 'preset/compound-on-its-beats',
          message: `bar ${bar} has ${ghosts} ghost notes, more than one per group of three`,
        });
    }

  // A landing lets go: without a tension curve of the card's own, each landing bar (a phrase's
  // landing, the resolution bar of an avoidDownbeat cycle of two bars or more) is no tenser than
  // the other bars on average (common practice: tension builds toward the landing and releases
  // on it). Re-measured by the oracle's own measure.
  // A phrase's fill bar is a run, not the groove: the landing is weighed against the groove bars.
  const landing = new Set<number>(plan.landingBars);
  for (const [voice, bars] of plan.resolutionBars)
    if (rulesOf(card, 'avoidDownbeat').some((r) => r.voice === voice && r.resolveEvery >= 2))
      for (const bar of bars) landing.add(bar);
  const groove = drill.bars.filter((b) => !landing.has(b.bar) && !plan.fillBars.includes(b.bar));
  if (
    rulesOf(card, 'tension').length === 0 &&
    card.measure === 'lhl' &&
    landing.size > 0 &&
    groove.length > 0
  ) {
    const tension = new Map(drill.bars.map((b) => [b.bar, measuredTension(plan, b)]));
    const others = groove.map((b) => tension.get(b.bar) ?? 0);
    const mean = others.reduce((a, b) => a + b, 0) / others.length;
    for (const bar of landing)
      if ((tension.get(bar) ?? 0) > mean + 1e-9)
        out.push({
          check: 'preset/landing-releases',
          message: `landing bar ${bar} measures ${tension.get(bar)}, tenser than the other bars' mean ${mean.toFixed(4)}`,
        });
  }

  // A phrase's landing crash is struck by the leading hand: a right-handed player leads the fill
  // with the right hand and comes off it onto the crash with that hand (common practice).
  const leading = card.hand === 'right' ? 'R' : 'L';
  for (const h of hits)
    if (h.source === 'phrase' && h.voice === 'crash' && h.hand !== leading)
      out.push({
        check: 'preset/landing-crash-on-the-leading-hand',
        message: `the landing crash at ${grid.describe(h.index)} is struck by hand ${h.hand}, not the leading hand ${leading}`,
      });

  // A fill goes around the toms high to floor without crossing the arms: the floor tom is not
  // played by the left hand (of a right-handed player; mirrored for a left-handed one) right
  // after the right hand played a higher tom at the grid note before (common practice).
  const higherTom = new Set(['tomHigh', 'tomMid']);
  for (const h of hits) {
    if (h.source !== 'phrase' || h.voice !== 'tomFloor' || h.hand !== crossing) continue;
    const before = (h.index - 1 + n) % n;
    if ((byIndex.get(before) ?? []).some((b) => b.hand === other && higherTom.has(b.voice)))
      out.push({
        check: 'preset/fill-does-not-cross-to-the-floor-tom',
        message: `hand ${crossing} plays the floor tom at ${grid.describe(h.index)} right after hand ${other} played a higher tom: the arms cross`,
      });
  }

  // A fill is led by the leading hand: its first stroke (the first hand note in the fill window)
  // is the leading hand's, so the fill's R L R L puts that hand on each beat (common practice).
  // And a fill whose voices include toms is carried by them: at least two thirds of its strokes
  // (the notes the phrase places in the window) are tom notes, the snare opening it, not a token
  // one or two toms after a run on the snare (common practice: a fill "around the kit"; the
  // share is our reading of a teacher's review, not a published figure).
  const fillRule = rulesOf(card, 'phrase')[0];
  if (fillRule)
    for (const bar of plan.fillBars) {
      const inWindow = hits
        .filter((h) => h.bar === bar && plan.fillWindow.has(h.index))
        .sort((a, b) => a.index - b.index);
      const first = inWindow.find((h) => h.hand !== null);
      if (first && first.hand !== leading)
        out.push({
          check: 'preset/fill-starts-on-the-leading-hand',
          message: `the fill of bar ${bar} starts with hand ${first.hand} (${first.voice} at ${grid.describe(first.index)}), not the leading hand ${leading}`,
        });
      const strokes = inWindow.filter((h) => h.source === 'phrase');
      const toms = strokes.filter((h) => /^tom/.test(h.voice)).length;
      if (fillRule.voices.some((v) => /^tom/.test(v)) && 3 * toms < 2 * strokes.length)
        out.push({
          check: 'preset/fill-goes-round-the-toms',
          message: `the fill of bar ${bar} has ${toms} tom notes in ${strokes.length} strokes`,
        });
    }

  // No hand plays accents on two grid notes in a row of a run (4 notes a second or more), as a
  // backbeat followed by an accented ghost-note slot on the same hand (common practice: an
  // accent is a full stroke from a raised stick, the note after it a tap on the way down; two in
  // a row by one hand also blur the backbeat). Notes the card's rules place are left alone (the
  // card asked for them); a fill note is in every pair this check reports.
  for (let i = 0; i < n; i++) {
    const j = (i + 1) % n;
    if (n < 2 || grid.notesPerMinuteAt(i, card.tempo) < 240) continue;
    for (const a of byIndex.get(i) ?? [])
      for (const b of byIndex.get(j) ?? [])
        if (
          a.hand !== null &&
          a.hand === b.hand &&
          a.dynamic === 'accent' &&
          b.dynamic === 'accent' &&
          (a.source === 'fill' || b.source === 'fill')
        )
          out.push({
            check: 'preset/accents-apart-on-one-hand',
            message: `hand ${a.hand} accents the ${a.voice} at ${grid.describe(i)} and the ${b.voice} right after`,
          });
  }

  // One foot does not play three grid notes in a row of a run (4 notes a second or more: three
  // sixteenths running on one kick pedal at 72 BPM) unless the card's rules place all three: a
  // foot cannot hand a note over as the hands do (common practice: a groove's kick plays
  // singles and the odd double, "1 e"). Drills loop, so the check wraps.
  for (const foot of ['kick', 'hihatFoot'])
    for (let i = 0; i < n && n >= 3; i++) {
      const three = [0, 1, 2].map((d) =>
        (byIndex.get((i + d) % n) ?? []).find((h) => h.voice === foot),
      );
      if (three.some((h) => !h)) continue;
      if (grid.notesPerMinuteAt(i, card.tempo) < 240) continue;
      if (grid.notesPerMinuteAt((i + 1) % n, card.tempo) < 240) continue;
      if (three.every((h) => h!.source !== 'fill')) continue;
      out.push({
        check: 'preset/no-foot-three-in-a-row',
        message: `the ${foot} plays three grid notes in a row from ${grid.describe(i)} at ${card.tempo} BPM`,
      });
    }

  out.push(...checkGrooves(plan, hits));

  // A card says each rule once: the same rule twice is a slip (it changes nothing but reads as
  // if it did).
  const written = card.rules.map((r) => JSON.stringify(r));
  written.forEach((r, i) => {
    if (written.indexOf(r) !== i)
      out.push({
        check: 'preset/no-repeated-rule',
        message: `rule ${i + 1} repeats rule ${written.indexOf(r) + 1}: ${r}`,
      });
  });
  return out;
}
