import type { Knex } from 'knex';
import { countRows, whereContains, type Page } from '../paging';
import { bool, isoTime } from '../rows';

interface WorksheetRow {
  id: number;
  owner_id: number;
  title: string;
  notes: string;
  paper: string;
  created_at: Date | number | string;
  updated_at: Date | number | string;
  item_count?: number | string;
}

interface ItemRow {
  id: number;
  worksheet_id: number;
  position: number;
  saved_drill_id: number | null;
  preset_id: string | null;
  seed: string | null;
  ladder_start: number;
  ladder_target: number;
  ladder_step: number;
  aid_sticking: boolean | number;
  aid_counts: boolean | number;
  aid_tension: boolean | number;
}

/** A worksheet as the list shows it. */
export interface WorksheetSummary {
  readonly id: number;
  readonly title: string;
  readonly notes: string;
  readonly paper: 'a4' | 'letter';
  readonly itemCount: number;
  readonly createdAt: string;
  readonly updatedAt: string;
}

/** One stored item: its source, ladder and aids, in worksheet order. */
export interface StoredItem {
  readonly source:
    | { readonly kind: 'saved'; readonly drillId: number }
    | { readonly kind: 'preset'; readonly presetId: string; readonly seed: string };
  readonly ladder: { readonly start: number; readonly target: number; readonly step: number };
  readonly aids: {
    readonly sticking: boolean;
    readonly counts: boolean;
    readonly tension: boolean;
  };
}

export interface WorksheetRecord extends WorksheetSummary {
  readonly items: readonly StoredItem[];
}

export interface WorksheetFields {
  readonly title: string;
  readonly notes: string;
  readonly paper: 'a4' | 'letter';
}

export const WORKSHEET_SORTS = ['updatedAt', 'createdAt', 'title', 'itemCount'] as const;
export type WorksheetSort = (typeof WORKSHEET_SORTS)[number];

export interface WorksheetListQuery {
  readonly page: number;
  readonly pageSize: number;
  readonly sort: WorksheetSort;
  readonly direction: 'asc' | 'desc';
  readonly q?: string;
}

const SORT_COLUMNS: Record<WorksheetSort, string> = {
  updatedAt: 'updated_at',
  createdAt: 'created_at',
  title: 'title',
  itemCount: 'item_count',
};

/** Reads and writes `worksheets` and their items, always scoped to the owner. */
export class WorksheetsRepository {
  constructor(private readonly db: Knex) {}

  async list(ownerId: number, query: WorksheetListQuery): Promise<Page<WorksheetSummary>> {
    const rows = this.db<WorksheetRow>('worksheets').where('owner_id', ownerId);
    if (query.q) whereContains(rows, 'title', query.q);
    const total = await countRows(rows);
    rows.select('worksheets.*', this.itemCount());
    const column = SORT_COLUMNS[query.sort];
    if (column === 'title') rows.orderByRaw(`lower(title) ${query.direction}`);
    else rows.orderBy(column, query.direction);
    const page = (await rows
      .orderBy('id', query.direction)
      .limit(query.pageSize)
      .offset(query.page * query.pageSize)) as WorksheetRow[];
    return { items: page.map(toSummary), total, page: query.page, pageSize: query.pageSize };
  }

  async find(ownerId: number, id: number): Promise<WorksheetRecord | undefined> {
    const row = (await this.db('worksheets')
      .select('worksheets.*', this.itemCount())
      .where({ id, owner_id: ownerId })
      .first()) as WorksheetRow | undefined;
    if (!row) return undefined;
    const items = (await this.db<ItemRow>('worksheet_items')
      .where('worksheet_id', id)
      .orderBy('position')) as ItemRow[];
    return { ...toSummary(row), items: items.map(toItem) };
  }

  /** Inserts the worksheet and its items together; returns the new id. */
  async insert(
    ownerId: number,
    fields: WorksheetFields,
    items: readonly StoredItem[],
  ): Promise<number> {
    return this.db.transaction(async (trx) => {
      const now = new Date();
      const [row] = (await trx('worksheets')
        .insert({ owner_id: ownerId, ...fields, created_at: now, updated_at: now })
        .returning('id')) as { id: number }[];
      const id = Number(row!.id);
      await insertItems(trx, id, items);
      return id;
    });
  }

  /** Changes the given fields; `items`, when given, replace the whole ordered list. */
  async update(
    ownerId: number,
    id: number,
    fields: Partial<WorksheetFields>,
    items?: readonly StoredItem[],
  ): Promise<void> {
    await this.db.transaction(async (trx) => {
      await trx('worksheets')
        .where({ id, owner_id: ownerId })
        .update({ ...fields, updated_at: new Date() });
      if (items) {
        await trx('worksheet_items').where('worksheet_id', id).delete();
        await insertItems(trx, id, items);
      }
    });
  }

  async delete(ownerId: number, id: number): Promise<void> {
    await this.db('worksheets').where({ id, owner_id: ownerId }).delete();
  }

  async countAll(): Promise<number> {
    return countRows(this.db('worksheets'));
  }

  private itemCount(): Knex.Raw {
    return this.db.raw(
      '(select count(*) from worksheet_items where worksheet_items.worksheet_id = worksheets.id) as item_count',
    );
  }
}

async function insertItems(
  trx: Knex.Transaction,
  worksheetId: number,
  items: readonly StoredItem[],
): Promise<void> {
  if (items.length === 0) return;
  await trx('worksheet_items').insert(
    items.map((item, position) => ({
      worksheet_id: worksheetId,
      position,
      saved_drill_id: item.source.kind === 'saved' ? item.source.drillId : null,
      preset_id: item.source.kind === 'preset' ? item.source.presetId : null,
      seed: item.source.kind === 'preset' ? item.source.seed : null,
      ladder_start: item.ladder.start,
      ladder_target: item.ladder.target,
      ladder_step: item.ladder.step,
      aid_sticking: item.aids.sticking,
      aid_counts: item.aids.counts,
      aid_tension: item.aids.tension,
    })),
  );
}

function toSummary(row: WorksheetRow): WorksheetSummary {
  return {
    id: Number(row.id),
    title: row.title,
    notes: row.notes,
    paper: row.paper === 'letter' ? 'letter' : 'a4',
    itemCount: Number(row.item_count ?? 0),
    createdAt: isoTime(row.created_at),
    updatedAt: isoTime(row.updated_at),
  };
}

function toItem(row: ItemRow): StoredItem {
  return {
    source:
      row.saved_drill_id !== null
        ? { kind: 'saved', drillId: Number(row.saved_drill_id) }
        : { kind: 'preset', presetId: row.preset_id ?? '', seed: row.seed ?? '' },
    ladder: {
      start: Number(row.ladder_start),
      target: Number(row.ladder_target),
      step: Number(row.ladder_step),
    },
    aids: {
      sticking: bool(row.aid_sticking),
      counts: bool(row.aid_counts),
      tension: bool(row.aid_tension),
    },
  };
}
