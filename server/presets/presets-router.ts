import { Router } from 'express';
import { z } from 'zod';
import { requireRole, requireSignIn } from '../auth/require-role';
import { seedSchema } from '../drills/drill-schemas';
import { queryBoolean } from '../paging';
import { levelSchema, tagSchema, tagsSchema, titleSchema } from '../rule-cards/card-fields';
import {
  meterFilter,
  ruleCardListSchema,
  subdivisionFilter,
  toListQuery,
} from '../rule-cards/rule-cards-router';
import { validate } from '../validate';
import type { PresetsService } from './presets-service';

const presetParams = z.object({
  id: z.string().min(1).max(200, 'A preset id has at most 200 characters.'),
});

const drillQuery = z.object({ seed: seedSchema });

const listSchema = z.object({
  all: queryBoolean.default(false),
  tag: tagSchema.optional(),
  level: levelSchema.optional(),
  meter: meterFilter.optional(),
  subdivision: subdivisionFilter.optional(),
});

const updateSchema = z.strictObject({
  title: titleSchema.optional(),
  summary: z.string().trim().max(2000, 'A summary has at most 2000 characters.').optional(),
  level: levelSchema.nullable().optional(),
  tags: tagsSchema.optional(),
  position: z
    .number({ error: 'The position is a number.' })
    .int('The position is a whole number.')
    .min(0, 'The position is 0 or more.')
    .max(100_000, 'The position is at most 100000.')
    .optional(),
  published: z.boolean({ error: 'Published is true or false.' }).optional(),
});

const promoteSchema = z.strictObject({
  ruleCardId: z
    .number({ error: 'The rule card id is a number.' })
    .int('The rule card id is a whole number.')
    .min(1, 'The rule card id is a positive number.'),
});

/**
 * `/api/presets`: published presets for everyone signed in (the admin also sees withdrawn ones
 * with `?all=true`), a preset's drill at a seed, a cached thumbnail each, the admin's edits and promotions, and "start from
 * this" for teachers. See docs/api-authoring.md.
 */
export function createPresetsRouter(service: PresetsService, engineVersion: string): Router {
  const router = Router();

  router.get('/', requireSignIn, validate({ query: listSchema }), async (req, res) => {
    const filter = req.query as unknown as z.output<typeof listSchema>;
    res.json({ presets: await service.list(req.user!, filter) });
  });

  // Teachers' live cards for the admin to promote (archived ones are not offered).
  const candidateSchema = ruleCardListSchema.omit({ archived: true });
  router.get(
    '/candidates',
    requireRole('admin'),
    validate({ query: candidateSchema }),
    async (req, res) => {
      const query = req.query as unknown as z.output<typeof candidateSchema>;
      res.json(await service.candidates(toListQuery({ ...query, archived: false })));
    },
  );

  router.post(
    '/promote',
    requireRole('admin'),
    validate({ body: promoteSchema }),
    async (req, res) => {
      const { ruleCardId } = req.body as z.output<typeof promoteSchema>;
      res.status(201).json({ preset: await service.promote(ruleCardId) });
    },
  );

  router.get('/:id', requireSignIn, validate({ params: presetParams }), async (req, res) => {
    res.json({ preset: await service.get(req.user!, idOf(req.params)) });
  });

  router.get(
    '/:id/drill',
    requireSignIn,
    validate({ params: presetParams, query: drillQuery }),
    async (req, res) => {
      const { seed } = req.query as unknown as z.output<typeof drillQuery>;
      res.json({ drill: await service.drill(req.user!, idOf(req.params), seed) });
    },
  );

  router.get(
    '/:id/thumbnail.svg',
    requireSignIn,
    validate({ params: presetParams }),
    async (req, res) => {
      const svg = await service.thumbnail(req.user!, idOf(req.params), engineVersion);
      // The same for everyone who may see it; the browser may keep it for an hour.
      res.setHeader('Cache-Control', 'private, max-age=3600');
      res.type('image/svg+xml').send(svg);
    },
  );

  router.put(
    '/:id',
    requireRole('admin'),
    validate({ params: presetParams, body: updateSchema }),
    async (req, res) => {
      const changes = req.body as z.output<typeof updateSchema>;
      res.json({ preset: await service.update(idOf(req.params), changes) });
    },
  );

  router.post(
    '/:id/start',
    requireRole('teacher', 'admin'),
    validate({ params: presetParams }),
    async (req, res) => {
      res.status(201).json({ ruleCard: await service.start(req.user!, idOf(req.params)) });
    },
  );

  return router;
}

function idOf(params: unknown): string {
  return (params as { id: string }).id;
}
