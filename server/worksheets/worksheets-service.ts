import { parseRuleCard } from '../../shared/generator/index';
import type { DrillsRepository } from '../drills/drills-repository';
import { HttpError, notFound, type ErrorDetail } from '../http-error';
import type { Page } from '../paging';
import type { PresetsRepository } from '../presets/presets-repository';
import { copyTitle } from '../rule-cards/rule-cards-service';
import { MIN_TEMPO, type ItemInput, type Paper } from './worksheet-schemas';
import type {
  StoredItem,
  WorksheetListQuery,
  WorksheetRecord,
  WorksheetsRepository,
  WorksheetSummary,
} from './worksheets-repository';

/** An item as the API sends it: what is stored, plus the drill's title and tempo to show. */
export interface WorksheetItem extends StoredItem {
  readonly title: string;
  /** The drill's own tempo, or null when its preset has gone. */
  readonly tempo: number | null;
  /** Why the item cannot be printed (a preset withdrawn since), else null. */
  readonly problem: string | null;
}

export interface Worksheet extends Omit<WorksheetRecord, 'items'> {
  readonly items: readonly WorksheetItem[];
}

export interface WorksheetInput {
  readonly title: string;
  readonly notes: string;
  readonly paper: Paper;
  readonly items: readonly ItemInput[];
}

export type WorksheetChanges = Partial<WorksheetInput>;

const MISSING = 'There is no worksheet with that id among yours.';
/** A ladder left out climbs this far below the drill's tempo up to it. */
const DEFAULT_CLIMB = 20;
const DEFAULT_STEP = 4;

/**
 * Worksheets: ordered drills, each a saved drill of the teacher's own or a published preset at a
 * seed, with a tempo ladder and the aids to print. Items are checked against what the teacher may
 * use every time they are written.
 */
export class WorksheetsService {
  constructor(
    private readonly worksheets: WorksheetsRepository,
    private readonly drills: Pick<DrillsRepository, 'find'>,
    private readonly presets: Pick<PresetsRepository, 'find'>,
  ) {}

  list(ownerId: number, query: WorksheetListQuery): Promise<Page<WorksheetSummary>> {
    return this.worksheets.list(ownerId, query);
  }

  async get(ownerId: number, id: number): Promise<Worksheet> {
    const record = await this.worksheets.find(ownerId, id);
    if (!record) throw notFound(MISSING);
    const items = await Promise.all(record.items.map((item) => this.describe(ownerId, item)));
    return { ...record, items };
  }

  async create(ownerId: number, input: WorksheetInput): Promise<Worksheet> {
    const items = await this.checkItems(ownerId, input.items);
    const id = await this.worksheets.insert(
      ownerId,
      { title: input.title, notes: input.notes, paper: input.paper },
      items,
    );
    return this.get(ownerId, id);
  }

  async update(ownerId: number, id: number, changes: WorksheetChanges): Promise<Worksheet> {
    await this.get(ownerId, id);
    const items = changes.items ? await this.checkItems(ownerId, changes.items) : undefined;
    const { items: _items, ...fields } = changes;
    await this.worksheets.update(ownerId, id, fields, items);
    return this.get(ownerId, id);
  }

  async duplicate(ownerId: number, id: number): Promise<Worksheet> {
    const source = await this.worksheets.find(ownerId, id);
    if (!source) throw notFound(MISSING);
    const copyId = await this.worksheets.insert(
      ownerId,
      { title: copyTitle(source.title), notes: source.notes, paper: source.paper },
      source.items,
    );
    return this.get(ownerId, copyId);
  }

  async remove(ownerId: number, id: number): Promise<void> {
    await this.get(ownerId, id);
    await this.worksheets.delete(ownerId, id);
  }

  /** Refuses items the teacher may not use, each under its field path; fills in left-out ladders. */
  private async checkItems(ownerId: number, items: readonly ItemInput[]): Promise<StoredItem[]> {
    const details: ErrorDetail[] = [];
    const checked: StoredItem[] = [];
    for (const [index, item] of items.entries()) {
      const at = `body.items.${index}.source`;
      const tempo = await this.tempoOf(ownerId, item.source);
      if (tempo === null) {
        details.push(
          item.source.kind === 'saved'
            ? {
                path: `${at}.drillId`,
                message: `There is no saved drill with id ${item.source.drillId} among yours.`,
              }
            : {
                path: `${at}.presetId`,
                message: `There is no published preset with id "${item.source.presetId}".`,
              },
        );
        continue;
      }
      const ladder = item.ladder ?? {
        start: Math.max(MIN_TEMPO, tempo - DEFAULT_CLIMB),
        target: tempo,
        step: DEFAULT_STEP,
      };
      checked.push({ source: item.source, ladder, aids: item.aids });
    }
    if (details.length > 0) {
      throw new HttpError(
        400,
        'validation_failed',
        details.map((d) => d.message).join(' '),
        details,
      );
    }
    return checked;
  }

  /** The drill's tempo, or null when the teacher may not use that source. */
  private async tempoOf(ownerId: number, source: StoredItem['source']): Promise<number | null> {
    if (source.kind === 'saved') {
      const drill = await this.drills.find(ownerId, source.drillId);
      return drill ? drill.snapshot.card.tempo : null;
    }
    const preset = await this.presets.find(source.presetId);
    return preset?.published ? parseRuleCard(preset.card).tempo : null;
  }

  private async describe(ownerId: number, item: StoredItem): Promise<WorksheetItem> {
    if (item.source.kind === 'saved') {
      const drill = await this.drills.find(ownerId, item.source.drillId);
      // Deleting a saved drill deletes its items too; this covers a delete racing this read.
      if (!drill) return { ...item, title: '', tempo: null, problem: 'This saved drill is gone.' };
      return { ...item, title: drill.title, tempo: drill.snapshot.card.tempo, problem: null };
    }
    const preset = await this.presets.find(item.source.presetId);
    if (!preset?.published) {
      return {
        ...item,
        title: item.source.presetId,
        tempo: null,
        problem: 'This preset has been withdrawn; take it off the worksheet or choose another.',
      };
    }
    return {
      ...item,
      title: `${preset.title} (seed ${item.source.seed})`,
      tempo: parseRuleCard(preset.card).tempo,
      problem: null,
    };
  }
}
