import type { Knex } from 'knex';
import { parseRuleCard } from '../../shared/generator/index';
import { BUILT_IN_PRESETS, type BuiltInPreset } from '../../shared/generator/presets/index';
import { cardFacts } from '../rule-cards/card-check';
import { BUILT_IN_CURATION, type Curation } from './built-in-curation';
import { PresetsRepository } from './presets-repository';

export type BuiltInCuration = Readonly<Record<string, Curation>>;

/**
 * Copies the built-in rule cards into the presets table: each one missing is inserted
 * (published, with its starting level and tags); one the admin never edited follows the card
 * and texts of this release; one the admin edited is left as the admin left it. Safe on every
 * start. Returns how many rows were inserted or brought up to date.
 */
export async function syncBuiltInPresets(
  db: Knex,
  builtIns: readonly BuiltInPreset[] = BUILT_IN_PRESETS,
  curation: BuiltInCuration = BUILT_IN_CURATION,
): Promise<number> {
  const rows = builtIns.map((preset) => {
    let facts;
    try {
      facts = cardFacts(parseRuleCard(preset.card));
    } catch (error) {
      throw new Error(`Built-in preset "${preset.id}" has an invalid rule card: ${String(error)}`, {
        cause: error,
      });
    }
    return {
      id: preset.id,
      title: preset.title,
      summary: preset.summary,
      card: preset.card,
      facts,
      level: curation[preset.id]?.level ?? null,
      tags: curation[preset.id]?.tags ?? [],
      published: true,
      credit: null,
      builtIn: true,
    };
  });
  const presets = new PresetsRepository(db);
  const inserted = await presets.insertMissing(rows);
  return inserted + (await presets.refreshUnedited(rows));
}
