/** Why a file was refused; each code has one plain-words message built where it is thrown. */
export const MIDI_IMPORT_REFUSALS = [
  'not_midi',
  'truncated',
  'damaged',
  'unsupported_timing',
  'unsupported_meter',
  'meter_change',
  'no_such_track',
  'no_notes',
  'no_drum_notes',
  'too_long',
  'too_many_notes',
] as const;
export type MidiImportRefusal = (typeof MIDI_IMPORT_REFUSALS)[number];

/** The only error the importer throws: a file it cannot read as a drum groove, and why. */
export class MidiImportError extends Error {
  override readonly name = 'MidiImportError';
  constructor(
    readonly code: MidiImportRefusal,
    message: string,
  ) {
    super(message);
  }
}
