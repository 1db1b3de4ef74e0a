import type { Drill } from '../../shared/generator/index';
import type { PublicUser } from '../auth/roles';
import { generateOrRefuse, type DrillGenerator } from '../drills/drill-generator';
import { HttpError, notFound } from '../http-error';
import { cardFacts, checkCard } from '../rule-cards/card-check';
import { fileSlug, type Level } from '../rule-cards/card-fields';
import type { Page } from '../paging';
import type {
  RuleCardDetail,
  RuleCardListQuery,
  RuleCardsRepository,
  TeacherRuleCard,
} from '../rule-cards/rule-cards-repository';
import type { Preset, PresetChanges, PresetsRepository } from './presets-repository';
import { THUMBNAIL_BARS } from './engrave-thumbnail';
import { threadedThumbnails } from './thumbnail-thread';

/** A preset as the API sends it. */
export interface PresetView {
  readonly id: string;
  readonly title: string;
  readonly summary: string;
  readonly card: unknown;
  readonly meter: string;
  readonly subdivision: string;
  readonly level: Level | null;
  readonly tags: readonly string[];
  readonly position: number;
  readonly published: boolean;
  readonly credit: string | null;
}

export interface PresetListFilter {
  readonly all: boolean;
  readonly tag?: string;
  readonly level?: Level;
  readonly meter?: string;
  readonly subdivision?: number;
}

/** Draws the first bars of a drill as a small SVG. */
export type ThumbnailRenderer = (drill: Drill) => Promise<string>;

/**
 * Engraves thumbnails in a worker thread (see engrave-thumbnail.ts for the drawing), so the first
 * draw, which loads jsdom, the fonts and VexFlow, never holds up a request.
 */
export const engraveThumbnail: ThumbnailRenderer = threadedThumbnails();

export { THUMBNAIL_BARS };

const MISSING = 'There is no preset rule card with that id.';

/**
 * Curated presets: everyone signed in browses the published ones, the admin edits, publishes,
 * withdraws and promotes, teachers copy one into their own cards.
 */
export class PresetsService {
  constructor(
    private readonly presets: PresetsRepository,
    private readonly cards: Pick<
      RuleCardsRepository,
      'findAny' | 'insert' | 'find' | 'listTeachers'
    >,
    private readonly generate: DrillGenerator,
    private readonly render: ThumbnailRenderer,
  ) {}

  async list(user: PublicUser, filter: PresetListFilter): Promise<PresetView[]> {
    if (filter.all && user.role !== 'admin') {
      throw new HttpError(403, 'forbidden', 'Only admins can see withdrawn presets.');
    }
    const presets = await this.presets.list({
      includeWithdrawn: filter.all,
      tag: filter.tag,
      level: filter.level,
      meter: filter.meter,
      slots: filter.subdivision,
    });
    return presets.map(toView);
  }

  /** A preset the user may see: withdrawn ones only for the admin. */
  async get(user: PublicUser, id: string): Promise<PresetView> {
    return toView(await this.visible(user, id));
  }

  /**
   * The preset's drill at `seed`, generated here so the drill page draws it without loading the
   * engine (and zod) into the browser first; a card the engine refuses is a 400 in its words.
   */
  async drill(user: PublicUser, id: string, seed: string): Promise<Drill> {
    const preset = await this.visible(user, id);
    return generateOrRefuse(this.generate, checkCard(preset.card, 'card'), seed);
  }

  /** The preset's first bars at its default seed (its id), engraved once and kept. */
  async thumbnail(user: PublicUser, id: string, engineVersion: string): Promise<string> {
    const preset = await this.visible(user, id);
    const cached = await this.presets.thumbnail(id);
    if (cached?.svg && cached.engine === engineVersion) return cached.svg;
    return this.draw(preset, engineVersion);
  }

  /**
   * Draws and keeps every preset's thumbnail that is missing or from another engine version,
   * one preset at a time and giving way to requests between presets, and says how many it drew.
   * The server runs it once it listens, so the gallery's first visitor finds them drawn: the
   * engine's work for each one otherwise runs inside the visitor's thumbnail requests, and the
   * gallery's list request waits behind it. A preset whose card gives no drill is left out.
   */
  async drawThumbnails(engineVersion: string): Promise<number> {
    let drawn = 0;
    for (const preset of await this.presets.list({ includeWithdrawn: true })) {
      await new Promise((resolve) => setImmediate(resolve));
      const cached = await this.presets.thumbnail(preset.id);
      if (cached?.svg && cached.engine === engineVersion) continue;
      try {
        await this.draw(preset, engineVersion);
        drawn += 1;
      } catch (error) {
        if (!(error instanceof HttpError)) throw error;
      }
    }
    return drawn;
  }

  private async draw(preset: Preset, engineVersion: string): Promise<string> {
    let drill: Drill;
    try {
      drill = generateOrRefuse(this.generate, checkCard(preset.card, 'card'), preset.id);
    } catch (error) {
      if (!(error instanceof HttpError)) throw error;
      throw notFound('This preset has no thumbnail: its card gives no drill at its default seed.');
    }
    const svg = await this.render({ ...drill, bars: drill.bars.slice(0, THUMBNAIL_BARS) });
    await this.presets.storeThumbnail(preset.id, svg, engineVersion);
    return svg;
  }

  async update(id: string, changes: PresetChanges): Promise<PresetView> {
    if (!(await this.presets.update(id, changes))) throw notFound(MISSING);
    return toView((await this.presets.find(id))!);
  }

  /** Teachers' cards the admin may promote, a page at a time. */
  candidates(query: RuleCardListQuery): Promise<Page<TeacherRuleCard>> {
    return this.cards.listTeachers(query);
  }

  /** Copies any teacher's card into the presets, credited to the teacher, withdrawn at first. */
  async promote(ruleCardId: number): Promise<PresetView> {
    const found = await this.cards.findAny(ruleCardId);
    if (!found) throw notFound('There is no rule card with that id.');
    const { card, ownerName } = found;
    const id = await this.freeId(fileSlug(card.title));
    await this.presets.insert({
      id,
      title: card.title,
      summary: '',
      card: card.card,
      facts: cardFacts(checkCard(card.card, 'card')),
      level: card.level,
      tags: card.tags,
      published: false,
      credit: ownerName,
      builtIn: false,
    });
    return toView((await this.presets.find(id))!);
  }

  /** "Start from this": a copy of the preset in the user's own rule cards. */
  async start(user: PublicUser, id: string): Promise<RuleCardDetail> {
    const preset = await this.visible(user, id);
    const cardId = await this.cards.insert({
      ownerId: user.id,
      title: preset.title,
      card: preset.card,
      facts: cardFacts(checkCard(preset.card, 'card')),
      tags: preset.tags,
      level: preset.level,
      fromPreset: { id: preset.id, title: preset.title },
    });
    return (await this.cards.find(user.id, cardId))!;
  }

  private async visible(user: PublicUser, id: string): Promise<Preset> {
    const preset = await this.presets.find(id);
    if (!preset || (!preset.published && user.role !== 'admin')) throw notFound(MISSING);
    return preset;
  }

  private async freeId(base: string): Promise<string> {
    const taken = await this.presets.ids();
    if (!taken.has(base)) return base;
    let n = 2;
    while (taken.has(`${base}-${n}`)) n += 1;
    return `${base}-${n}`;
  }
}

export function toView(preset: Preset): PresetView {
  return {
    id: preset.id,
    title: preset.title,
    summary: preset.summary,
    card: preset.card,
    meter: preset.meter,
    subdivision: preset.subdivision,
    level: preset.level,
    tags: preset.tags,
    position: preset.position,
    published: preset.published,
    credit: preset.credit,
  };
}
