import { HttpError, notFound } from '../http-error';
import type { Page } from '../paging';
import type { PresetsRepository } from '../presets/presets-repository';
import { cardFacts, checkCard } from './card-check';
import type { Level } from './card-fields';
import { readEnvelope, writeEnvelope, type RuleCardEnvelope } from './rule-card-envelope';
import type {
  RuleCardDetail,
  RuleCardListQuery,
  RuleCardSummary,
  RuleCardsRepository,
} from './rule-cards-repository';

export interface RuleCardInput {
  readonly title: string;
  readonly card: unknown;
  readonly tags?: readonly string[];
  readonly level?: Level | null;
  readonly fromPreset?: string;
}

export interface RuleCardEdit {
  readonly title?: string;
  readonly card?: unknown;
  readonly tags?: readonly string[];
  readonly level?: Level | null;
}

const MISSING = 'There is no rule card with that id among yours.';

/**
 * A teacher's rule cards. Another teacher's card is "missing" (404), so its existence does not
 * leak; every stored card has passed the engine's `parseRuleCard`.
 */
export class RuleCardsService {
  constructor(
    private readonly cards: RuleCardsRepository,
    private readonly presets: Pick<PresetsRepository, 'find'>,
  ) {}

  list(ownerId: number, query: RuleCardListQuery): Promise<Page<RuleCardSummary>> {
    return this.cards.list(ownerId, query);
  }

  async get(ownerId: number, id: number): Promise<RuleCardDetail> {
    const card = await this.cards.find(ownerId, id);
    if (!card) throw notFound(MISSING);
    return card;
  }

  async create(ownerId: number, input: RuleCardInput): Promise<RuleCardDetail> {
    const facts = cardFacts(checkCard(input.card));
    let fromPreset: { id: string; title: string } | null = null;
    if (input.fromPreset !== undefined) {
      const preset = await this.presets.find(input.fromPreset);
      if (!preset) {
        const message = 'There is no preset with that id.';
        throw new HttpError(400, 'validation_failed', message, [
          { path: 'body.fromPreset', message },
        ]);
      }
      fromPreset = { id: preset.id, title: preset.title };
    }
    const id = await this.cards.insert({
      ownerId,
      title: input.title,
      card: input.card,
      facts,
      tags: input.tags ?? [],
      level: input.level ?? null,
      fromPreset,
    });
    return this.get(ownerId, id);
  }

  async update(ownerId: number, id: number, edit: RuleCardEdit): Promise<RuleCardDetail> {
    await this.get(ownerId, id);
    const facts = edit.card === undefined ? undefined : cardFacts(checkCard(edit.card));
    await this.cards.update(ownerId, id, { ...edit, facts });
    return this.get(ownerId, id);
  }

  async duplicate(ownerId: number, id: number): Promise<RuleCardDetail> {
    const source = await this.get(ownerId, id);
    const copyId = await this.cards.insert({
      ownerId,
      title: copyTitle(source.title),
      card: source.card,
      facts: cardFacts(checkCard(source.card)),
      tags: source.tags,
      level: source.level,
      fromPreset: source.fromPreset,
    });
    return this.get(ownerId, copyId);
  }

  /** Deletes the card, or archives it when saved drills use it; says which. */
  async remove(ownerId: number, id: number): Promise<'deleted' | 'archived'> {
    const card = await this.get(ownerId, id);
    if (card.drillCount > 0) {
      await this.cards.archive(ownerId, id);
      return 'archived';
    }
    await this.cards.delete(ownerId, id);
    return 'deleted';
  }

  async export(ownerId: number, id: number): Promise<RuleCardEnvelope> {
    return writeEnvelope(await this.get(ownerId, id));
  }

  async import(ownerId: number, body: unknown): Promise<RuleCardDetail> {
    const envelope = readEnvelope(body);
    return this.create(ownerId, { ...envelope, card: envelope.card });
  }
}

/** "Groove (copy)", kept within the title's length limit. */
export function copyTitle(title: string): string {
  const suffix = ' (copy)';
  return `${title.slice(0, 200 - suffix.length)}${suffix}`;
}
