import {
  importMidiGroove,
  IMPORT_SEED,
  MidiImportError,
  type MidiImport,
} from '../../shared/formats/midi-import/index';
import type { DrillsRepository } from '../drills/drills-repository';
import type { DrillsService, SavedDrill } from '../drills/drills-service';
import { HttpError } from '../http-error';

/**
 * MIDI groove import: a preview stores nothing; saving keeps the imported drill itself as the
 * saved drill's snapshot (its card is the inferred one, its seed `imported`), so the saved drill
 * shows exactly what the file held, never a regenerated variation.
 */
export class ImportsService {
  constructor(
    private readonly drills: Pick<DrillsRepository, 'insert'>,
    private readonly savedDrills: Pick<DrillsService, 'get'>,
  ) {}

  preview(file: Uint8Array, track: number | undefined): MidiImport {
    try {
      return importMidiGroove(file, track === undefined ? {} : { track });
    } catch (error) {
      if (error instanceof MidiImportError) {
        const path = error.code === 'no_such_track' ? 'body.track' : 'body.file';
        throw new HttpError(400, error.code, error.message, [{ path, message: error.message }]);
      }
      throw error;
    }
  }

  async save(
    ownerId: number,
    file: Uint8Array,
    input: { track?: number | undefined; title: string; notes?: string | undefined },
  ): Promise<SavedDrill> {
    const groove = this.preview(file, input.track);
    const id = await this.drills.insert({
      ownerId,
      ruleCardId: null,
      presetId: null,
      title: input.title,
      notes: input.notes ?? '',
      card: groove.card,
      seed: IMPORT_SEED,
      snapshot: groove.drill,
    });
    return this.savedDrills.get(ownerId, id);
  }
}
