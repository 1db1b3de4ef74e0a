import type { DrillBar } from '../../shared/generator/index';
import { HttpError, notFound } from '../http-error';
import type { Page } from '../paging';
import type { PresetsRepository } from '../presets/presets-repository';
import { checkCard } from '../rule-cards/card-check';
import type { RuleCardsRepository } from '../rule-cards/rule-cards-repository';
import type { SeedLink, SeedLinksRepository } from '../seed-links/seed-links-repository';
import { generateOrRefuse, type DrillGenerator } from './drill-generator';
import type {
  DrillListQuery,
  DrillsRepository,
  SavedDrillRecord,
  SavedDrillSummary,
} from './drills-repository';

/** A saved drill as the API sends it. */
export interface SavedDrill extends SavedDrillRecord {
  readonly shareLink: SeedLink | null;
}

export interface SaveDrillInput {
  readonly ruleCardId?: number;
  readonly presetId?: string;
  readonly title: string;
  readonly notes?: string;
  readonly card: unknown;
  readonly seed: string;
  readonly keep?: readonly DrillBar[];
}

const MISSING = 'There is no saved drill with that id among yours.';

/**
 * Saved drills. The server regenerates the drill from the card, the seed and the pinned bars
 * (`keep`, which the engine places as given) and keeps the result;
 * afterwards the drill is always served from that snapshot, never regenerated, so it stays
 * exactly as saved when the engine changes.
 */
export class DrillsService {
  constructor(
    private readonly drills: DrillsRepository,
    private readonly cards: Pick<RuleCardsRepository, 'find'>,
    private readonly presets: Pick<PresetsRepository, 'find'>,
    private readonly links: SeedLinksRepository,
    private readonly generate: DrillGenerator,
  ) {}

  list(ownerId: number, query: DrillListQuery): Promise<Page<SavedDrillSummary>> {
    return this.drills.list(ownerId, query);
  }

  async get(ownerId: number, id: number): Promise<SavedDrill> {
    const drill = await this.drills.find(ownerId, id);
    if (!drill) throw notFound(MISSING);
    return { ...drill, shareLink: (await this.links.latestFor(id)) ?? null };
  }

  async save(ownerId: number, input: SaveDrillInput): Promise<SavedDrill> {
    const card = checkCard(input.card);
    if (input.ruleCardId !== undefined && !(await this.cards.find(ownerId, input.ruleCardId))) {
      throw notFound('There is no rule card with that id among yours.');
    }
    if (input.presetId !== undefined && !(await this.presets.find(input.presetId))) {
      const message = 'There is no preset with that id.';
      throw new HttpError(400, 'validation_failed', message, [{ path: 'body.presetId', message }]);
    }
    const snapshot = generateOrRefuse(this.generate, card, input.seed, { keep: input.keep ?? [] });
    const id = await this.drills.insert({
      ownerId,
      ruleCardId: input.ruleCardId ?? null,
      presetId: input.presetId ?? null,
      title: input.title,
      notes: input.notes ?? '',
      card: input.card,
      seed: input.seed,
      snapshot,
    });
    return this.get(ownerId, id);
  }

  async update(
    ownerId: number,
    id: number,
    changes: { title?: string; notes?: string },
  ): Promise<SavedDrill> {
    await this.get(ownerId, id);
    await this.drills.update(ownerId, id, changes);
    return this.get(ownerId, id);
  }

  async remove(ownerId: number, id: number): Promise<void> {
    await this.get(ownerId, id);
    // Codes first: should the delete fail, the links are still there and still answer.
    await this.links.keepAsWithdrawn(id);
    await this.drills.delete(ownerId, id);
  }
}
