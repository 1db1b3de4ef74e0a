import type { Knex } from 'knex';
import { bool, fromJson, isoTime } from '../rows';
import type { CardFacts } from '../rule-cards/card-check';
import { tagPattern, type Level } from '../rule-cards/card-fields';

/** A row of the `presets` table. */
interface PresetRow {
  id: string;
  title: string;
  summary: string;
  card: string;
  level: Level | null;
  tags: string;
  meter: string;
  subdivision: string;
  slots: number | null;
  position: number;
  published: boolean | number;
  credit: string | null;
  built_in: boolean | number;
  thumbnail_svg: string | null;
  thumbnail_engine: string | null;
  created_at: Date | number | string;
  updated_at: Date | number | string;
}

/** A preset as the server keeps it. */
export interface Preset {
  readonly id: string;
  readonly title: string;
  readonly summary: string;
  readonly card: unknown;
  readonly level: Level | null;
  readonly tags: readonly string[];
  readonly meter: string;
  readonly subdivision: string;
  readonly position: number;
  readonly published: boolean;
  readonly credit: string | null;
  readonly builtIn: boolean;
  readonly updatedAt: string;
}

/** What a new preset row holds (the position is given by the repository when left out). */
export interface NewPreset {
  readonly id: string;
  readonly title: string;
  readonly summary: string;
  readonly card: unknown;
  readonly facts: CardFacts;
  readonly level: Level | null;
  readonly tags: readonly string[];
  readonly published: boolean;
  readonly credit: string | null;
  readonly builtIn: boolean;
}

export interface PresetFilter {
  readonly includeWithdrawn: boolean;
  readonly tag?: string;
  readonly level?: Level;
  readonly meter?: string;
  readonly slots?: number;
}

export interface PresetChanges {
  readonly title?: string;
  readonly summary?: string;
  readonly level?: Level | null;
  readonly tags?: readonly string[];
  readonly position?: number;
  readonly published?: boolean;
}

const LIST_COLUMNS = [
  'id',
  'title',
  'summary',
  'card',
  'level',
  'tags',
  'meter',
  'subdivision',
  'position',
  'published',
  'credit',
  'built_in',
  'updated_at',
] as const;

/** Reads and writes the `presets` table. */
export class PresetsRepository {
  constructor(private readonly db: Knex) {}

  async list(filter: PresetFilter): Promise<Preset[]> {
    const query = this.db<PresetRow>('presets').select(...LIST_COLUMNS);
    if (!filter.includeWithdrawn) query.where('published', true);
    if (filter.tag) query.where('tags', 'like', tagPattern(filter.tag));
    if (filter.level) query.where('level', filter.level);
    if (filter.meter) query.where('meter', filter.meter);
    if (filter.slots !== undefined) query.where('slots', filter.slots);
    const rows = await query.orderBy('position').orderBy('id');
    return rows.map(toPreset);
  }

  async find(id: string): Promise<Preset | undefined> {
    const row = await this.db<PresetRow>('presets')
      .select(...LIST_COLUMNS)
      .where({ id })
      .first();
    return row ? toPreset(row) : undefined;
  }

  async ids(): Promise<Set<string>> {
    const rows = await this.db<PresetRow>('presets').select('id');
    return new Set(rows.map((row) => row.id));
  }

  /**
   * Inserts presets that are not there yet, after the last position, in the order given; an id
   * already present is left exactly as it is. Returns how many were inserted.
   */
  async insertMissing(presets: readonly NewPreset[]): Promise<number> {
    return this.db.transaction(async (trx) => {
      const present = new Set((await trx('presets').select('id')).map((r: { id: string }) => r.id));
      const fresh = presets.filter((preset) => !present.has(preset.id));
      if (fresh.length === 0) return 0;
      let position = await lastPosition(trx);
      const now = new Date();
      for (const preset of fresh) {
        position += 1;
        await trx('presets')
          .insert(toRow(preset, position, now))
          .onConflict('id')
          .ignore();
      }
      return fresh.length;
    });
  }

  /**
   * Brings each built-in preset the admin never edited (its `updated_at` still equals its
   * `created_at`) up to the card and texts shipped now, and drops its thumbnail so it is drawn
   * again. An edited preset is left exactly as the admin left it. Returns how many changed.
   */
  async refreshUnedited(presets: readonly NewPreset[]): Promise<number> {
    return this.db.transaction(async (trx) => {
      const shipped = new Map(presets.map((preset) => [preset.id, shippedContent(preset)]));
      const rows: PresetRow[] = await trx('presets')
        .where('built_in', true)
        .whereRaw('?? = ??', ['updated_at', 'created_at'])
        .select('*');
      let changed = 0;
      for (const row of rows) {
        const content = shipped.get(row.id);
        if (!content || sameContent(row, content)) continue;
        await trx('presets')
          .where({ id: row.id })
          .update({ ...content, thumbnail_svg: null, thumbnail_engine: null });
        changed += 1;
      }
      return changed;
    });
  }

  /** Inserts one preset at the end of the list. */
  async insert(preset: NewPreset): Promise<void> {
    await this.db.transaction(async (trx) => {
      const position = (await lastPosition(trx)) + 1;
      await trx('presets').insert(toRow(preset, position, new Date()));
    });
  }

  /** Applies the admin's changes; false when there is no such preset. */
  async update(id: string, changes: PresetChanges): Promise<boolean> {
    const row: Partial<Record<keyof PresetRow, unknown>> = { updated_at: new Date() };
    if (changes.title !== undefined) row.title = changes.title;
    if (changes.summary !== undefined) row.summary = changes.summary;
    if (changes.level !== undefined) row.level = changes.level;
    if (changes.tags !== undefined) row.tags = JSON.stringify(changes.tags);
    if (changes.position !== undefined) row.position = changes.position;
    if (changes.published !== undefined) row.published = changes.published;
    return (await this.db('presets').where({ id }).update(row)) > 0;
  }

  /** The cached thumbnail and the engine version that drew it. */
  async thumbnail(id: string): Promise<{ svg: string | null; engine: string | null } | undefined> {
    const row = await this.db<PresetRow>('presets')
      .select('thumbnail_svg', 'thumbnail_engine')
      .where({ id })
      .first();
    return row ? { svg: row.thumbnail_svg, engine: row.thumbnail_engine } : undefined;
  }

  async storeThumbnail(id: string, svg: string, engine: string): Promise<void> {
    // The updated_at stamp is left alone: a cache fill is not an edit.
    await this.db('presets').where({ id }).update({ thumbnail_svg: svg, thumbnail_engine: engine });
  }
}

async function lastPosition(db: Knex): Promise<number> {
  const rows = (await db('presets').max({ last: 'position' })) as { last: number | null }[];
  return rows[0]?.last === null || rows[0]?.last === undefined ? -1 : Number(rows[0].last);
}

/** The columns a release ships for a built-in preset. */
function shippedContent(preset: NewPreset) {
  return {
    title: preset.title,
    summary: preset.summary,
    card: JSON.stringify(preset.card),
    level: preset.level,
    tags: JSON.stringify(preset.tags),
    meter: preset.facts.meter,
    subdivision: preset.facts.subdivision,
    slots: preset.facts.slots,
  };
}

function sameContent(row: PresetRow, content: ReturnType<typeof shippedContent>): boolean {
  // Drivers differ in how they hand back numbers; compare as text.
  const text = (value: unknown) => (value === null || value === undefined ? null : String(value));
  return (Object.keys(content) as (keyof typeof content)[]).every(
    (key) => text(row[key]) === text(content[key]),
  );
}

function toRow(preset: NewPreset, position: number, now: Date) {
  return {
    id: preset.id,
    ...shippedContent(preset),
    position,
    published: preset.published,
    credit: preset.credit,
    built_in: preset.builtIn,
    created_at: now,
    updated_at: now,
  };
}

function toPreset(row: Pick<PresetRow, (typeof LIST_COLUMNS)[number]>): Preset {
  return {
    id: row.id,
    title: row.title,
    summary: row.summary,
    card: fromJson(row.card),
    level: row.level,
    tags: fromJson<string[]>(row.tags),
    meter: row.meter,
    subdivision: row.subdivision,
    position: Number(row.position),
    published: bool(row.published),
    credit: row.credit,
    builtIn: bool(row.built_in),
    updatedAt: isoTime(row.updated_at),
  };
}
