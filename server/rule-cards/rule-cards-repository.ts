import type { Knex } from 'knex';
import { countRows, whereContains, type Page } from '../paging';
import { fromJson, isoTime } from '../rows';
import type { CardFacts } from './card-check';
import { tagPattern, type Level } from './card-fields';

/** A row of the `rule_cards` table, with the count of saved drills that use it. */
interface RuleCardRow {
  id: number;
  owner_id: number;
  title: string;
  card: string;
  tags: string;
  level: Level | null;
  meter: string;
  subdivision: string;
  slots: number | null;
  bars: number;
  tempo: number;
  archived_at: Date | number | string | null;
  from_preset_id: string | null;
  from_preset_title: string | null;
  created_at: Date | number | string;
  updated_at: Date | number | string;
  drill_count: number | string;
}

/** A rule card as the lists show it. */
export interface RuleCardSummary {
  readonly id: number;
  readonly title: string;
  readonly tags: readonly string[];
  readonly level: Level | null;
  readonly meter: string;
  readonly subdivision: string;
  readonly bars: number;
  readonly tempo: number;
  readonly archived: boolean;
  readonly drillCount: number;
  readonly updatedAt: string;
}

/** A teacher's rule card as the admin's promotion list shows it. */
export interface TeacherRuleCard extends RuleCardSummary {
  readonly ownerName: string;
}

/** A rule card with the card itself and where it came from. */
export interface RuleCardDetail extends RuleCardSummary {
  readonly card: unknown;
  readonly fromPreset: { readonly id: string; readonly title: string } | null;
  readonly createdAt: string;
}

export interface NewRuleCard {
  readonly ownerId: number;
  readonly title: string;
  readonly card: unknown;
  readonly facts: CardFacts;
  readonly tags: readonly string[];
  readonly level: Level | null;
  readonly fromPreset: { readonly id: string; readonly title: string } | null;
}

export interface RuleCardChanges {
  readonly title?: string;
  readonly card?: unknown;
  readonly facts?: CardFacts;
  readonly tags?: readonly string[];
  readonly level?: Level | null;
}

export const RULE_CARD_SORTS = [
  'updatedAt',
  'createdAt',
  'title',
  'level',
  'meter',
  'subdivision',
  'bars',
  'tempo',
  'drillCount',
] as const;
export type RuleCardSort = (typeof RULE_CARD_SORTS)[number];

export interface RuleCardListQuery {
  readonly page: number;
  readonly pageSize: number;
  readonly sort: RuleCardSort;
  readonly direction: 'asc' | 'desc';
  readonly q?: string;
  readonly tag?: string;
  readonly level?: Level;
  readonly meter?: string;
  readonly slots?: number;
  readonly archived: boolean;
}

const SORT_COLUMNS: Record<RuleCardSort, string> = {
  updatedAt: 'updated_at',
  createdAt: 'created_at',
  title: 'title',
  level: 'level',
  meter: 'meter',
  subdivision: 'slots',
  bars: 'bars',
  tempo: 'tempo',
  drillCount: 'drill_count',
};

const LEVEL_RANK =
  "case rule_cards.level when 'beginner' then 1 when 'intermediate' then 2 when 'advanced' then 3 else 0 end";

/** Reads and writes `rule_cards`. Every read is scoped to the owner. */
export class RuleCardsRepository {
  constructor(private readonly db: Knex) {}

  private withDrillCount(): Knex.QueryBuilder {
    return this.db('rule_cards').select(
      'rule_cards.*',
      this.db.raw(
        '(select count(*) from saved_drills where saved_drills.rule_card_id = rule_cards.id) as drill_count',
      ),
    );
  }

  async list(ownerId: number, query: RuleCardListQuery): Promise<Page<RuleCardSummary>> {
    const page = await this.pageOf(
      this.withDrillCount().where('rule_cards.owner_id', ownerId),
      query,
    );
    return { ...page, items: page.items.map(toSummary) };
  }

  /**
   * Every teacher's cards with the teacher's name, for the admin to choose one to promote; the
   * text search finds the title or the teacher's name.
   */
  async listTeachers(query: RuleCardListQuery): Promise<Page<TeacherRuleCard>> {
    const rows = this.withDrillCount()
      .select('users.name as owner_name')
      .join('users', 'users.id', 'rule_cards.owner_id')
      .where('users.role', 'teacher');
    if (query.q) whereContains(rows, ['rule_cards.title', 'users.name'], query.q);
    const page = await this.pageOf(rows, { ...query, q: undefined });
    return {
      ...page,
      items: (page.items as (RuleCardRow & { owner_name: string })[]).map((row) => ({
        ...toSummary(row),
        ownerName: row.owner_name,
      })),
    };
  }

  /** Filters, counts, sorts and cuts one page of a rule-card query. */
  private async pageOf(
    rows: Knex.QueryBuilder,
    query: RuleCardListQuery,
  ): Promise<Page<RuleCardRow>> {
    if (query.archived) rows.whereNotNull('rule_cards.archived_at');
    else rows.whereNull('rule_cards.archived_at');
    if (query.q) whereContains(rows, 'rule_cards.title', query.q);
    if (query.tag) rows.where('rule_cards.tags', 'like', tagPattern(query.tag));
    if (query.level) rows.where('rule_cards.level', query.level);
    if (query.meter) rows.where('rule_cards.meter', query.meter);
    if (query.slots !== undefined) rows.where('rule_cards.slots', query.slots);
    const total = await countRows(rows);
    const column = SORT_COLUMNS[query.sort];
    if (column === 'title') rows.orderByRaw(`lower(rule_cards.title) ${query.direction}`);
    // A mixed grid (no single slot count) ranks above every even one, in SQLite and PostgreSQL.
    else if (column === 'slots')
      rows.orderByRaw(`coalesce(rule_cards.slots, 1000) ${query.direction}`);
    // Levels rank by difficulty, not alphabetically; a card without one ranks lowest.
    else if (column === 'level') rows.orderByRaw(`${LEVEL_RANK} ${query.direction}`);
    // The drill count is a computed column, named as such; the rest belong to rule_cards.
    else rows.orderBy(column === 'drill_count' ? column : `rule_cards.${column}`, query.direction);
    const items = (await rows
      .orderBy('rule_cards.id', query.direction)
      .limit(query.pageSize)
      .offset(query.page * query.pageSize)) as RuleCardRow[];
    return { items, total, page: query.page, pageSize: query.pageSize };
  }

  /** The owner's card with this id (archived or not), or undefined. */
  async find(ownerId: number, id: number): Promise<RuleCardDetail | undefined> {
    const row = (await this.withDrillCount().where({ id, owner_id: ownerId }).first()) as
      RuleCardRow | undefined;
    return row ? toDetail(row) : undefined;
  }

  /** Any owner's card with this id, with its owner's name (the admin's promotion reads it). */
  async findAny(id: number): Promise<{ card: RuleCardDetail; ownerName: string } | undefined> {
    const row = (await this.withDrillCount()
      .select('users.name as owner_name')
      .join('users', 'users.id', 'rule_cards.owner_id')
      .where('rule_cards.id', id)
      .first()) as (RuleCardRow & { owner_name: string }) | undefined;
    return row ? { card: toDetail(row), ownerName: row.owner_name } : undefined;
  }

  async insert(card: NewRuleCard): Promise<number> {
    const now = new Date();
    const [row] = (await this.db('rule_cards')
      .insert({
        owner_id: card.ownerId,
        title: card.title,
        card: JSON.stringify(card.card),
        tags: JSON.stringify(card.tags),
        level: card.level,
        ...factColumns(card.facts),
        from_preset_id: card.fromPreset?.id ?? null,
        from_preset_title: card.fromPreset?.title ?? null,
        created_at: now,
        updated_at: now,
      })
      .returning('id')) as { id: number }[];
    return Number(row!.id);
  }

  /** Applies changes to the owner's card; false when the owner has no such card. */
  async update(ownerId: number, id: number, changes: RuleCardChanges): Promise<boolean> {
    const row: Record<string, unknown> = { updated_at: new Date() };
    if (changes.title !== undefined) row['title'] = changes.title;
    if (changes.card !== undefined) row['card'] = JSON.stringify(changes.card);
    if (changes.facts) Object.assign(row, factColumns(changes.facts));
    if (changes.tags !== undefined) row['tags'] = JSON.stringify(changes.tags);
    if (changes.level !== undefined) row['level'] = changes.level;
    return (await this.db('rule_cards').where({ id, owner_id: ownerId }).update(row)) > 0;
  }

  async archive(ownerId: number, id: number): Promise<void> {
    const now = new Date();
    await this.db('rule_cards')
      .where({ id, owner_id: ownerId })
      .update({ archived_at: now, updated_at: now });
  }

  async delete(ownerId: number, id: number): Promise<void> {
    await this.db('rule_cards').where({ id, owner_id: ownerId }).delete();
  }

  async countAll(): Promise<number> {
    return countRows(this.db('rule_cards'));
  }
}

function factColumns(facts: CardFacts) {
  return {
    meter: facts.meter,
    subdivision: facts.subdivision,
    slots: facts.slots,
    bars: facts.bars,
    tempo: facts.tempo,
  };
}

function toSummary(row: RuleCardRow): RuleCardSummary {
  return {
    id: Number(row.id),
    title: row.title,
    tags: fromJson<string[]>(row.tags),
    level: row.level,
    meter: row.meter,
    subdivision: row.subdivision,
    bars: Number(row.bars),
    tempo: Number(row.tempo),
    archived: row.archived_at !== null,
    drillCount: Number(row.drill_count),
    updatedAt: isoTime(row.updated_at),
  };
}

function toDetail(row: RuleCardRow): RuleCardDetail {
  return {
    ...toSummary(row),
    card: fromJson(row.card),
    fromPreset:
      row.from_preset_id !== null || row.from_preset_title !== null
        ? { id: row.from_preset_id ?? '', title: row.from_preset_title ?? '' }
        : null,
    createdAt: isoTime(row.created_at),
  };
}
