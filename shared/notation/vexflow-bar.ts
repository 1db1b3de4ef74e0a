/**
 * VexFlow objects for one bar of the notation model: one voice per layer (hands stems up, feet
 * stems down), with the model's beams (per beat, or per group in grouped eighth meters), tuplet
 * brackets per beat, accents, ghost-note parentheses and open-hi-hat circles. Built fresh for
 * every layout pass; nothing here draws.
 */
import {
  Articulation,
  Beam,
  BoundingBox,
  Dot,
  Formatter,
  GhostNote,
  Modifier,
  ModifierPosition,
  Ornament,
  Parenthesis,
  Stem,
  StaveNote,
  Tuplet,
  Voice,
  VoiceMode,
} from 'vexflow/core';
import type { LayerBar, NotationBar, NotationEvent, NotationModel } from './notation-model';
import type { Layer } from './staff-placement';

/**
 * Where rests of each layer sit: the hands' on the top line, the feet's on the bottom line, each
 * two whole spaces from the middle, so a rest keeps its place among the lines (its dots in spaces)
 * and stays in its own voice's half of the staff, clear of the other voice's notes (E. Gould,
 * "Behind Bars", Faber Music 2011, ch. "Rests", two parts on one stave; from memory).
 */
const REST_KEY: Readonly<Record<Layer, string>> = { hands: 'f/5', feet: 'e/4' };
/** Room an accent takes beyond a stem's tip, in pixels. */
const ACCENT_ROOM = 8;
/** A whole rest hangs from its key's line: the hands' from the fourth line, the feet's from the second. */
const BAR_REST_KEY: Readonly<Record<Layer, string>> = { hands: 'd/5', feet: 'g/4' };

/**
 * A note that can be drawn without measuring its bounding box: VexFlow measures it on every draw
 * only to lay the note's invisible hit area over it, which a drawing without hit areas skips
 * (see `EngravingContext.hitAreas`).
 */
export class BarNote extends StaveNote {
  private boxless = false;
  /** Set during construction, before any field initialiser runs (hence `declare`). */
  declare private headsBuiltOnce?: boolean;

  constructor(struct: ConstructorParameters<typeof StaveNote>[0]) {
    notesUnderConstruction++;
    try {
      super(struct);
    } finally {
      notesUnderConstruction--;
    }
  }

  /**
   * VexFlow's constructor builds the note heads twice: once when it sets the stem direction and
   * again at its end, from the same keys and direction. The first build is skipped (nothing in
   * between reads the heads), which was a sixth of engraving a bar.
   */
  override reset(): this {
    if (notesUnderConstruction > 0 && !this.headsBuiltOnce) {
      this.headsBuiltOnce = true;
      return this;
    }
    return super.reset();
  }

  override getBoundingBox(): BoundingBox {
    return this.boxless ? new BoundingBox(0, 0, 0, 0) : super.getBoundingBox();
  }

  /** Draw (with the note's style) into a context that draws no hit areas. */
  drawWithoutHitArea(): void {
    this.boxless = true;
    try {
      this.drawWithStyle();
    } finally {
      this.boxless = false;
    }
  }
}

/** How many `BarNote` constructors are running (one; a counter, should one ever nest). */
let notesUnderConstruction = 0;

export interface EngravedNote {
  readonly note: BarNote;
  readonly layer: Layer;
  readonly beat: number;
  readonly event: NotationEvent;
}

/**
 * A tuplet whose bracket can be moved to a line shared with the other brackets of its system, and
 * run on past its last note when that note lasts on (see `reachTo`).
 */
export class LevelTuplet extends Tuplet {
  private reach: number | null = null;

  /** Set the bracket at `y` (its line, as `getYPosition` gives it). */
  moveTo(y: number): void {
    this.options.yOffset += y - this.getYPosition();
  }

  /**
   * Let the bracket's right end run on to `x` (never shorter than VexFlow sets it): a group that
   * ends on a longer value ("r8 c4" under a "3") otherwise gets a bracket no wider than its first
   * two columns, its number squeezed between two stubs.
   */
  reachTo(x: number): void {
    this.reach = x;
  }

  override draw(): void {
    if (this.reach === null || !this.options.bracketed) {
      super.draw();
      return;
    }
    // VexFlow 5's bracketed drawing (Tuplet.draw), with the right end at the reach.
    const { location, textYOffset } = this.options;
    const ctx = this.checkContext();
    const first = this.notes[0]!;
    const last = this.notes[this.notes.length - 1]!;
    const x = first.getTieLeftX() - 5;
    this.width = Math.max(last.getTieRightX() - x + 5, this.reach - x);
    const y = this.getYPosition();
    const number = this.textElement.getWidth();
    ctx.openGroup('tuplet', this.getAttribute('id'));
    const arm = this.width / 2 - number / 2 - 5;
    if (arm > 0) {
      const down = location === Tuplet.LOCATION_BOTTOM ? 1 : 0;
      ctx.fillRect(x, y, arm, 1);
      ctx.fillRect(x + this.width / 2 + number / 2 + 5, y, arm, 1);
      ctx.fillRect(x, y + down, 1, location * 10);
      ctx.fillRect(x + this.width, y + down, 1, location * 10);
    }
    const textY =
      y +
      this.textElement.getHeight() / 2 +
      (location === Tuplet.LOCATION_TOP ? -1 : 1) * textYOffset;
    this.textElement.renderText(ctx, x + this.width / 2 - number / 2, textY);
    const box = this.getBoundingBox();
    ctx.pointerRect(box.getX(), box.getY(), box.getW(), box.getH());
    ctx.closeGroup();
    this.setRendered();
  }
}

export interface EngravedTuplet {
  readonly tuplet: LevelTuplet;
  readonly layer: Layer;
  readonly numNotes: number;
  /** The beat (from 1) the bracket is over. */
  readonly beat: number;
  /** Printed (see `NotationTuplet.shown`); a hidden tuplet still times its notes. */
  readonly shown: boolean;
  readonly simile: boolean;
  /** The group's last event is longer than its shortest (a quarter after an eighth rest). */
  readonly endsLong: boolean;
}

export interface EngravedBar {
  readonly voices: readonly { readonly layer: Layer; readonly voice: Voice }[];
  readonly notes: readonly EngravedNote[];
  readonly beams: readonly { readonly beam: Beam; readonly layer: Layer }[];
  readonly tuplets: readonly EngravedTuplet[];
  /** The bar's beat subdivisions, from which its grid voice is set (see `GridVoices`). */
  readonly subdivisions: readonly number[];
}

/** Build the voices, beams and tuplets of one bar. */
export function engraveBar(bar: NotationBar, model: NotationModel): EngravedBar {
  const notes: EngravedNote[] = [];
  const beams: { beam: Beam; layer: Layer }[] = [];
  const tuplets: EngravedTuplet[] = [];
  const voices = model.layers.map((layer) => {
    const voice = new Voice({ numBeats: model.meter.beats, beatValue: model.meter.unit });
    voice.setMode(VoiceMode.SOFT);
    const layerBar = bar.layers.find((l) => l.layer === layer);
    if (!layerBar) return { layer, voice };
    const staveNotes = layerBar.events.map((event) => staveNoteOf(event, layer));
    staveNotes.forEach((note, i) => {
      const event = layerBar.events[i]!;
      notes.push({ note, layer, beat: event.beat, event });
    });
    addBeamsAndTuplets(layerBar, staveNotes, beams, tuplets);
    voice.addTickables(staveNotes);
    return { layer, voice };
  });
  const subdivisions = bar.beats.map((beat) => beat.subdivision);
  return { voices, notes, beams, tuplets, subdivisions };
}

/**
 * Each note's left edge and glyph width, in `notes` order, once the bar is formatted to its stave
 * (the counting, the beat areas, the tension marks and the polyrhythm brackets all read them, and
 * VexFlow works each out afresh on every call).
 */
export function noteExtents(
  engraved: EngravedBar,
): readonly { readonly left: number; readonly width: number }[] {
  let extents = measuredExtents.get(engraved);
  if (!extents) {
    extents = engraved.notes.map(({ note }) => ({
      left: note.getAbsoluteX(),
      width: note.getGlyphWidth(),
    }));
    measuredExtents.set(engraved, extents);
  }
  return extents;
}
const measuredExtents = new WeakMap<
  EngravedBar,
  readonly { readonly left: number; readonly width: number }[]
>();

/** Every voice the formatter sets together: the layers and the grid. */
export function formattedVoices(engraved: EngravedBar, grids: GridVoices): Voice[] {
  return [...engraved.voices.map((v) => v.voice), grids.of(engraved.subdivisions)];
}

/**
 * A formatter that spaces by one measure for every voice. VexFlow otherwise sizes each gap by
 * the voice that spans it, normalised over that voice's own notes, so a kick alone on "e" and a
 * hi-hat on "&" get unrelated gaps.
 */
export function barFormatter(): Formatter {
  return new Formatter({ globalSoftmax: true });
}

/**
 * The narrowest width the bar's notes can be set in, before stretching. Measured without the
 * grid: its empty columns only take room when the bar is stretched to its line.
 */
export function minimumBarWidth(engraved: EngravedBar): number {
  const voices = engraved.voices.map((v) => v.voice);
  return barFormatter().joinVoices(voices).preCalculateMinTotalWidth(voices);
}

/**
 * One invisible note on every slot of each beat's subdivision. Both layers share one rhythmic
 * grid, so every slot, sounding or not, becomes a column, and each column's gap to the next is
 * one slot: equal slots get equal room whichever voice plays them (E. Gould, "Behind Bars",
 * Faber Music 2011, ch. "Horizontal spacing": space in proportion to duration; from memory).
 *
 * Bars with the same subdivisions share one grid voice for the length of a render: its ghost
 * notes carry no modifiers and are never drawn, and each bar is formatted to the end before the
 * next one takes the voice over, so building a few hundred invisible notes per bar is saved.
 */
export class GridVoices {
  private readonly built = new Map<string, Voice>();

  constructor(private readonly meter: { readonly beats: number; readonly unit: number }) {}

  of(subdivisions: readonly number[]): Voice {
    const key = subdivisions.join(',');
    let voice = this.built.get(key);
    if (!voice) {
      voice = gridVoice(subdivisions, this.meter);
      this.built.set(key, voice);
    }
    return voice;
  }
}

function gridVoice(
  subdivisions: readonly number[],
  meter: { readonly beats: number; readonly unit: number },
): Voice {
  const voice = new Voice({ numBeats: meter.beats, beatValue: meter.unit });
  voice.setMode(VoiceMode.SOFT);
  for (const subdivision of subdivisions) {
    let base = 1;
    while (base * 2 <= subdivision) base *= 2;
    for (let slot = 0; slot < subdivision; slot++) {
      const ghost = new GhostNote({ duration: String(meter.unit * base) });
      if (base !== subdivision) ghost.applyTickMultiplier(base, subdivision);
      voice.addTickable(ghost);
    }
  }
  return voice;
}

function addBeamsAndTuplets(
  layerBar: LayerBar,
  staveNotes: BarNote[],
  beams: { beam: Beam; layer: Layer }[],
  tuplets: EngravedTuplet[],
): void {
  for (const { notes, breaks } of layerBar.beams) {
    const beam = new Beam(notes.map((i) => staveNotes[i]!));
    // Level beams, as drum-set parts beam the cymbal line (common practice): every stem of the
    // group reaches the outermost one, so an accent at a stem's tip sits clear of the beam.
    beam.renderOptions.flatBeams = true;
    // VexFlow breaks the sixteenth (and shorter) beams after each listed note.
    if (breaks.length > 0) beam.breakSecondaryAt([...breaks]);
    beams.push({ beam, layer: layerBar.layer });
  }
  for (const { ratio, events, shown, simile, bracketed } of layerBar.tuplets) {
    const accented = events.some((i) => layerBar.events[i]?.accent);
    const tuplet = new LevelTuplet(
      events.map((i) => staveNotes[i]!),
      {
        numNotes: ratio.numNotes,
        notesOccupied: ratio.notesOccupied,
        ratioed: false,
        bracketed,
        location: layerBar.layer === 'hands' ? Tuplet.LOCATION_TOP : Tuplet.LOCATION_BOTTOM,
        // Outside the accents (VexFlow sets the bracket just past the stems, where an accent
        // at a stem's tip already is).
        yOffset: accented ? (layerBar.layer === 'hands' ? -ACCENT_ROOM : ACCENT_ROOM) : 0,
      },
    );
    const beat = layerBar.events[events[0]!]?.beat ?? 1;
    // Longer than the group's shortest value (a quarter after an eighth rest in triplets).
    const lengths = events.map((i) => length(layerBar.events[i]!.duration));
    const endsLong = lengths[lengths.length - 1]! > Math.min(...lengths);
    tuplets.push({
      tuplet,
      layer: layerBar.layer,
      numNotes: ratio.numNotes,
      beat,
      shown,
      simile,
      endsLong,
    });
  }
}

/** A written value's length, in whole notes. */
function length(duration: NotationEvent['duration']): number {
  return (duration.dots ? 1.5 : 1) / duration.value;
}

function staveNoteOf(event: NotationEvent, layer: Layer): BarNote {
  const rest = event.kind === 'rest';
  const note = new BarNote({
    keys: rest
      ? [event.barRest ? BAR_REST_KEY[layer] : REST_KEY[layer]]
      : event.heads.map((head) => head.key),
    duration: `${event.duration.value}${rest ? 'r' : ''}`,
    dots: event.duration.dots,
    clef: 'percussion',
    stemDirection: layer === 'hands' ? Stem.UP : Stem.DOWN,
    // A whole-bar rest stands in the middle of its bar (common practice).
    alignCenter: event.barRest === true,
  });
  if (event.duration.dots) Dot.buildAndAttach([note], { all: true });
  if (rest) return note;
  const below = layer === 'feet';
  if (event.accent) {
    note.addModifier(
      new Articulation('a>').setPosition(below ? ModifierPosition.BELOW : ModifierPosition.ABOVE),
    );
  }
  addGhostParentheses(note, event);
  if (event.heads.some((head) => head.open)) {
    note.addModifier(new Ornament('plungerOpen').setPosition(Modifier.Position.ABOVE));
  }
  return note;
}

/** Ghost notes in parentheses: the whole chord when all heads are ghosts, else just those heads. */
function addGhostParentheses(note: StaveNote, event: NotationEvent): void {
  if (event.heads.every((head) => head.ghost)) {
    Parenthesis.buildAndAttach([note]);
    return;
  }
  event.heads.forEach((head, index) => {
    if (!head.ghost) return;
    note.addModifier(new Parenthesis(ModifierPosition.LEFT), index);
    note.addModifier(new Parenthesis(ModifierPosition.RIGHT), index);
  });
}
