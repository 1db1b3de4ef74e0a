import { z } from 'zod';
import type { DrillSource } from '../../shared/formats/drill-source';
import type { Drill, RuleCard } from '../../shared/generator/index';
import type { PublicUser } from '../auth/roles';
import { generateOrRefuse, type DrillGenerator } from '../drills/drill-generator';
import { drillBarSchema, seedSchema } from '../drills/drill-schemas';
import type { DrillsRepository } from '../drills/drills-repository';
import { HttpError, notFound } from '../http-error';
import type { PresetsRepository } from '../presets/presets-repository';
import { checkCard } from '../rule-cards/card-check';

/**
 * Which drill an export, a PDF or a worksheet entry is about: a preset at a seed, one of the
 * teacher's saved drills, or a card as the editor holds it (with its pinned bars).
 */
export const drillSourceSchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({
      kind: z.literal('preset'),
      presetId: z
        .string({ error: 'The preset id is text.' })
        .min(1, 'Give a preset id.')
        .max(200, 'A preset id has at most 200 characters.'),
      seed: seedSchema,
    }),
    z.strictObject({
      kind: z.literal('saved'),
      drillId: z
        .number({ error: 'The saved drill id is a number.' })
        .int('The saved drill id is a whole number.')
        .min(1, 'The saved drill id is a positive number.'),
    }),
    z.strictObject({
      kind: z.literal('card'),
      card: z.unknown().refine((card) => card !== undefined, 'The rule card ("card") is missing.'),
      seed: seedSchema,
      keep: z.array(drillBarSchema).max(64, 'At most 64 bars can be pinned.').optional(),
    }),
  ],
  { error: 'The drill source needs a kind: "preset", "saved" or "card".' },
);

export type { DrillSource };

/** A drill ready to print or export, with where the app shows it. */
export interface ResolvedDrill {
  readonly title: string;
  readonly card: RuleCard;
  readonly seed: string;
  readonly drill: Drill;
  /**
   * Path of the page that shows this drill: `/drills/:presetId?seed=…`, `/saved-drills/:id`, or,
   * for a card that is stored nowhere, the drills page where a drill is opened.
   */
  readonly link: string;
}

export interface DrillSourceDeps {
  readonly presets: Pick<PresetsRepository, 'find'>;
  readonly drills: Pick<DrillsRepository, 'find'>;
  readonly generate: DrillGenerator;
}

/** Where a request body carries the source (error details name fields under it). */
const AT = 'body.source';

/**
 * Turns a source into its drill. A preset the user may not see and another teacher's saved drill
 * are 404s (the same answer as a missing one, so ids reveal nothing); a bad card or a card the
 * engine refuses is a 400 naming the field under `body.source`.
 */
export async function resolveDrillSource(
  deps: DrillSourceDeps,
  user: PublicUser,
  source: DrillSource,
): Promise<ResolvedDrill> {
  switch (source.kind) {
    case 'preset': {
      const preset = await deps.presets.find(source.presetId);
      if (!preset || (!preset.published && user.role !== 'admin')) {
        throw notFound('There is no preset rule card with that id.');
      }
      const card = checkCard(preset.card, `${AT}.card`);
      const drill = underSource(() => generateOrRefuse(deps.generate, card, source.seed));
      const link = `/drills/${encodeURIComponent(preset.id)}?seed=${encodeURIComponent(source.seed)}`;
      return { title: preset.title, card, seed: source.seed, drill, link };
    }
    case 'saved': {
      const saved = await deps.drills.find(user.id, source.drillId);
      if (!saved) throw notFound('There is no saved drill with that id among yours.');
      // The snapshot is served as saved, never regenerated (see DrillsService).
      const drill = saved.snapshot;
      return {
        title: saved.title,
        card: drill.card,
        seed: saved.seed,
        drill,
        link: `/saved-drills/${saved.id}`,
      };
    }
    case 'card': {
      const card = checkCard(source.card, `${AT}.card`);
      const keep = source.keep ?? [];
      const drill = underSource(() => generateOrRefuse(deps.generate, card, source.seed, { keep }));
      return {
        title: `Drill, seed ${source.seed}`,
        card,
        seed: source.seed,
        drill,
        link: '/drills',
      };
    }
  }
}

/** The engine's refusals name `body.keep`, `body.seed`…; here those fields sit under the source. */
function underSource<T>(run: () => T): T {
  try {
    return run();
  } catch (error) {
    if (!(error instanceof HttpError) || !error.details) throw error;
    const details = error.details.map((d) => ({
      ...d,
      path: d.path.startsWith('body.') ? `${AT}.${d.path.slice('body.'.length)}` : d.path,
    }));
    throw new HttpError(error.status, error.code, error.message, details);
  }
}
