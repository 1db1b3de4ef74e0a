import { Router } from 'express';
import { z } from 'zod';
import { requireRole } from '../auth/require-role';
import { listQuery, queryBoolean } from '../paging';
import { validate } from '../validate';
import { fileSlug, levelSchema, tagSchema, tagsSchema, titleSchema } from './card-fields';
import { RULE_CARD_SORTS, type RuleCardListQuery } from './rule-cards-repository';
import type { RuleCardsService } from './rule-cards-service';

/** A numeric id in the path. */
export const idParams = z.object({
  id: z.coerce
    .number({ error: 'The id is a number.' })
    .int('The id is a whole number.')
    .min(1, 'The id is a positive number.')
    .max(2_147_483_647, 'That id is too large.'),
});

/** A meter as written on a score, e.g. `7/8`. */
export const meterFilter = z
  .string()
  .regex(/^\d{1,2}\/\d{1,2}$/, 'Write the meter as beats/unit, e.g. 7/8.');

/** Slots per beat, as a filter. */
export const subdivisionFilter = z.coerce
  .number({ error: 'The subdivision is a number of slots per beat.' })
  .int('The subdivision is a whole number of slots per beat.')
  .min(1, 'The subdivision is 1 to 16 slots per beat.')
  .max(16, 'The subdivision is 1 to 16 slots per beat.');

/** The rule-card list query: the common one with the card filters. */
export const ruleCardListSchema = listQuery(RULE_CARD_SORTS, 'updatedAt').extend({
  tag: tagSchema.optional(),
  level: levelSchema.optional(),
  meter: meterFilter.optional(),
  subdivision: subdivisionFilter.optional(),
  archived: queryBoolean.default(false),
});

const createSchema = z.strictObject({
  title: titleSchema,
  card: z.unknown().refine((card) => card !== undefined, 'The rule card ("card") is missing.'),
  tags: tagsSchema.optional(),
  level: levelSchema.nullable().optional(),
  fromPreset: z.string().min(1).max(200, 'A preset id has at most 200 characters.').optional(),
});

const updateSchema = z.strictObject({
  title: titleSchema.optional(),
  card: z.unknown().optional(),
  tags: tagsSchema.optional(),
  level: levelSchema.nullable().optional(),
});

type ListInput = z.output<typeof ruleCardListSchema>;

export function toListQuery(input: ListInput): RuleCardListQuery {
  const { subdivision, direction, ...rest } = input;
  const ascending = rest.sort === 'title' || rest.sort === 'meter' || rest.sort === 'level';
  return { ...rest, slots: subdivision, direction: direction ?? (ascending ? 'asc' : 'desc') };
}

/** `/api/rule-cards` (teachers and admins, each on their own cards); see docs/api-authoring.md. */
export function createRuleCardsRouter(service: RuleCardsService): Router {
  const router = Router();
  const author = requireRole('teacher', 'admin');

  router.get('/', author, validate({ query: ruleCardListSchema }), async (req, res) => {
    const query = req.query as unknown as ListInput;
    res.json(await service.list(req.user!.id, toListQuery(query)));
  });

  router.post('/', author, validate({ body: createSchema }), async (req, res) => {
    const ruleCard = await service.create(req.user!.id, req.body as z.output<typeof createSchema>);
    res.status(201).json({ ruleCard });
  });

  // Its own, smaller body limit is applied in app.ts before the common JSON parser.
  router.post('/import', author, async (req, res) => {
    const ruleCard = await service.import(req.user!.id, req.body);
    res.status(201).json({ ruleCard });
  });

  router.get('/:id', author, validate({ params: idParams }), async (req, res) => {
    res.json({ ruleCard: await service.get(req.user!.id, idOf(req.params)) });
  });

  router.put(
    '/:id',
    author,
    validate({ params: idParams, body: updateSchema }),
    async (req, res) => {
      const edit = req.body as z.output<typeof updateSchema>;
      res.json({ ruleCard: await service.update(req.user!.id, idOf(req.params), edit) });
    },
  );

  router.delete('/:id', author, validate({ params: idParams }), async (req, res) => {
    const outcome = await service.remove(req.user!.id, idOf(req.params));
    if (outcome === 'archived') res.json({ archived: true });
    else res.status(204).end();
  });

  router.post('/:id/duplicate', author, validate({ params: idParams }), async (req, res) => {
    res.status(201).json({ ruleCard: await service.duplicate(req.user!.id, idOf(req.params)) });
  });

  router.get('/:id/export', author, validate({ params: idParams }), async (req, res) => {
    const envelope = await service.export(req.user!.id, idOf(req.params));
    res.attachment(`${fileSlug(envelope.title)}.tensile.json`);
    res.json(envelope);
  });

  return router;
}

/** The validated numeric id (validate() replaced the raw params). */
export function idOf(params: unknown): number {
  return (params as { id: number }).id;
}
