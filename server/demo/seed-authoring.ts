import type { Knex } from 'knex';
import { UsersRepository } from '../auth/users-repository';
import { engineGenerator } from '../drills/drill-generator';
import { DrillsRepository } from '../drills/drills-repository';
import { DrillsService } from '../drills/drills-service';
import { PresetsRepository } from '../presets/presets-repository';
import { PresetsService, engraveThumbnail } from '../presets/presets-service';
import { RuleCardsRepository } from '../rule-cards/rule-cards-repository';
import { RuleCardsService } from '../rule-cards/rule-cards-service';
import { SeedLinksRepository } from '../seed-links/seed-links-repository';
import { SeedLinksService } from '../seed-links/seed-links-service';
import { demoCards, type DemoCard } from './demo-authoring';

/** What {@link seedDemoAuthoring} added. */
export interface AuthoringSeedCounts {
  readonly ruleCards: number;
  readonly drills: number;
  readonly links: number;
  readonly presets: number;
}

const NOTHING: AuthoringSeedCounts = { ruleCards: 0, drills: 0, links: 0, presets: 0 };

/**
 * Gives the demo teachers rule cards, saved drills, a shared seed link and a promoted preset,
 * through the same services the API uses (so every card passes the engine's checks). Runs only
 * while no one has any rule card or saved drill yet, so a restart adds nothing and never
 * re-creates what a teacher deleted once they have material of their own.
 */
export async function seedDemoAuthoring(
  db: Knex,
  cards: readonly DemoCard[] = demoCards(),
): Promise<AuthoringSeedCounts> {
  return db.transaction(async (trx) => {
    const ruleCards = new RuleCardsRepository(trx);
    const drills = new DrillsRepository(trx);
    if ((await ruleCards.countAll()) > 0 || (await drills.countAll()) > 0) return NOTHING;
    const users = new UsersRepository(trx);
    const presets = new PresetsRepository(trx);
    const cardService = new RuleCardsService(ruleCards, presets);
    const links = new SeedLinksRepository(trx);
    const drillService = new DrillsService(drills, ruleCards, presets, links, engineGenerator);
    const linkService = new SeedLinksService(links, drills);
    const presetService = new PresetsService(presets, ruleCards, engineGenerator, engraveThumbnail);

    const counts = { ruleCards: 0, drills: 0, links: 0, presets: 0 };
    for (const demo of cards) {
      const owner = await users.findByEmail(demo.owner);
      // The demo accounts may have been removed; their material is then left out too.
      if (!owner) continue;
      const ownerId = Number(owner.id);
      const card = await cardService.create(ownerId, {
        title: demo.title,
        card: demo.card,
        tags: demo.tags,
        level: demo.level,
        fromPreset: demo.fromPreset,
      });
      counts.ruleCards += 1;
      for (const drill of demo.drills) {
        const saved = await drillService.save(ownerId, {
          ruleCardId: card.id,
          title: drill.title,
          notes: drill.notes,
          card: demo.card,
          seed: drill.seed,
        });
        counts.drills += 1;
        if (drill.shared) {
          await linkService.share(ownerId, saved.id);
          counts.links += 1;
        }
      }
      if (demo.promote) {
        const preset = await presetService.promote(card.id);
        await presetService.update(preset.id, { summary: demo.promote.summary, published: true });
        counts.presets += 1;
      }
    }
    return counts;
  });
}
