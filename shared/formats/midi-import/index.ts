/**
 * MIDI groove import (pure, isomorphic): a Standard MIDI File's drum part read as a drill and an
 * inferred rule card. `importMidiGroove` throws only `MidiImportError`.
 */
export {
  importMidiGroove,
  IMPORT_SEED,
  MAX_BARS,
  GHOST_BELOW,
  ACCENT_FROM,
  type MidiImport,
  type MidiImportOptions,
  type BeatResidual,
} from './import-groove';
export { MidiImportError, MIDI_IMPORT_REFUSALS, type MidiImportRefusal } from './errors';
export { GM_PERCUSSION_VOICE, voiceOfKey } from './gm-percussion';
export { fitBeat, SUBDIVISIONS, TIE_TOLERANCE } from './quantise';
export type { MidiTrackSummary } from './read-midi';
