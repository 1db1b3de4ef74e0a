import type { Knex } from 'knex';
import type { Drill } from '../../shared/generator/index';
import { countRows, whereContains, type Page } from '../paging';
import { fromJson, isoTime } from '../rows';

/** A row of the `saved_drills` table. */
interface SavedDrillRow {
  id: number;
  owner_id: number;
  rule_card_id: number | null;
  preset_id: string | null;
  title: string;
  notes: string;
  card: string;
  seed: string;
  engine_version: string;
  snapshot: string;
  created_at: Date | number | string;
  updated_at: Date | number | string;
}

/** A saved drill as lists show it (without the card and the snapshot). */
export interface SavedDrillSummary {
  readonly id: number;
  readonly title: string;
  readonly notes: string;
  readonly ruleCardId: number | null;
  readonly presetId: string | null;
  readonly seed: string;
  readonly engineVersion: string;
  readonly createdAt: string;
  readonly updatedAt: string;
}

/** A saved drill with the card as it was and the drill as generated then. */
export interface SavedDrillRecord extends SavedDrillSummary {
  readonly card: unknown;
  readonly snapshot: Drill;
}

export interface NewSavedDrill {
  readonly ownerId: number;
  readonly ruleCardId: number | null;
  readonly presetId: string | null;
  readonly title: string;
  readonly notes: string;
  readonly card: unknown;
  readonly seed: string;
  readonly snapshot: Drill;
}

export const DRILL_SORTS = ['updatedAt', 'createdAt', 'title', 'seed'] as const;
export type DrillSort = (typeof DRILL_SORTS)[number];

export interface DrillListQuery {
  readonly page: number;
  readonly pageSize: number;
  readonly sort: DrillSort;
  readonly direction: 'asc' | 'desc';
  readonly q?: string;
  readonly ruleCardId?: number;
}

const SORT_COLUMNS: Record<DrillSort, string> = {
  updatedAt: 'updated_at',
  createdAt: 'created_at',
  title: 'title',
  seed: 'seed',
};

const SUMMARY_COLUMNS = [
  'id',
  'title',
  'notes',
  'rule_card_id',
  'preset_id',
  'seed',
  'engine_version',
  'created_at',
  'updated_at',
] as const;

/** Reads and writes `saved_drills`, always scoped to the owner. */
export class DrillsRepository {
  constructor(private readonly db: Knex) {}

  async list(ownerId: number, query: DrillListQuery): Promise<Page<SavedDrillSummary>> {
    const rows = this.db<SavedDrillRow>('saved_drills')
      .select(...SUMMARY_COLUMNS)
      .where('owner_id', ownerId);
    if (query.ruleCardId !== undefined) rows.where('rule_card_id', query.ruleCardId);
    if (query.q) whereContains(rows, 'title', query.q);
    const total = await countRows(rows);
    const column = SORT_COLUMNS[query.sort];
    if (column === 'title') rows.orderByRaw(`lower(title) ${query.direction}`);
    else rows.orderBy(column, query.direction);
    const page = (await rows
      .orderBy('id', query.direction)
      .limit(query.pageSize)
      .offset(query.page * query.pageSize)) as SavedDrillRow[];
    return { items: page.map(toSummary), total, page: query.page, pageSize: query.pageSize };
  }

  async find(ownerId: number, id: number): Promise<SavedDrillRecord | undefined> {
    const row = await this.db<SavedDrillRow>('saved_drills')
      .where({ id, owner_id: ownerId })
      .first();
    return row ? toRecord(row) : undefined;
  }

  /**
   * Any owner's drill with the owner's display name (for a seed link, which the link's code
   * authorises).
   */
  async findShared(id: number): Promise<(SavedDrillRecord & { ownerName: string }) | undefined> {
    const row = (await this.db('saved_drills')
      .select('saved_drills.*', 'users.name as owner_name')
      .join('users', 'users.id', 'saved_drills.owner_id')
      .where('saved_drills.id', id)
      .first()) as (SavedDrillRow & { owner_name: string }) | undefined;
    return row ? { ...toRecord(row), ownerName: row.owner_name } : undefined;
  }

  async insert(drill: NewSavedDrill): Promise<number> {
    const now = new Date();
    const [row] = (await this.db('saved_drills')
      .insert({
        owner_id: drill.ownerId,
        rule_card_id: drill.ruleCardId,
        preset_id: drill.presetId,
        title: drill.title,
        notes: drill.notes,
        card: JSON.stringify(drill.card),
        seed: drill.seed,
        engine_version: drill.snapshot.engine,
        snapshot: JSON.stringify(drill.snapshot),
        created_at: now,
        updated_at: now,
      })
      .returning('id')) as { id: number }[];
    return Number(row!.id);
  }

  async update(
    ownerId: number,
    id: number,
    changes: { title?: string; notes?: string },
  ): Promise<void> {
    const row: Record<string, unknown> = { updated_at: new Date() };
    if (changes.title !== undefined) row['title'] = changes.title;
    if (changes.notes !== undefined) row['notes'] = changes.notes;
    await this.db('saved_drills').where({ id, owner_id: ownerId }).update(row);
  }

  async delete(ownerId: number, id: number): Promise<void> {
    await this.db('saved_drills').where({ id, owner_id: ownerId }).delete();
  }

  async countAll(): Promise<number> {
    return countRows(this.db('saved_drills'));
  }
}

function toSummary(row: SavedDrillRow): SavedDrillSummary {
  return {
    id: Number(row.id),
    title: row.title,
    notes: row.notes,
    ruleCardId: row.rule_card_id === null ? null : Number(row.rule_card_id),
    presetId: row.preset_id,
    seed: row.seed,
    engineVersion: row.engine_version,
    createdAt: isoTime(row.created_at),
    updatedAt: isoTime(row.updated_at),
  };
}

function toRecord(row: SavedDrillRow): SavedDrillRecord {
  return { ...toSummary(row), card: fromJson(row.card), snapshot: fromJson<Drill>(row.snapshot) };
}
