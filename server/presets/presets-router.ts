import { Router } from 'express';
import { z } from 'zod';
import { requireSignIn } from '../auth/require-role';
import { notFound } from '../http-error';
import { validate } from '../validate';
import { meterText, subdivisionWord, type CardShape } from './preset-summary';

/** A built-in rule card as the engine's preset catalogue lists it. */
export interface PresetEntry {
  readonly id: string;
  readonly title: string;
  readonly summary: string;
  readonly card: unknown;
}

/** A preset as the API sends it: the raw card plus its meter and grid in words. */
export interface PresetView extends PresetEntry {
  readonly meter: string;
  readonly subdivision: string;
}

/** Normalises a raw card (the engine's `parseRuleCard`), throwing on an invalid one. */
export type CardParser = (card: unknown) => CardShape;

const presetParams = z.object({
  id: z.string().min(1).max(200, 'A preset id has at most 200 characters.'),
});

/** Builds the API views once; a preset whose card does not parse stops the server at start. */
export function presetViews(presets: readonly PresetEntry[], parseCard: CardParser): PresetView[] {
  return presets.map((preset) => {
    let card: CardShape;
    try {
      card = parseCard(preset.card);
    } catch (error) {
      throw new Error(`Built-in preset "${preset.id}" has an invalid rule card: ${String(error)}`, {
        cause: error,
      });
    }
    const { id, title, summary } = preset;
    return {
      id,
      title,
      summary,
      card: preset.card,
      meter: meterText(card),
      subdivision: subdivisionWord(card),
    };
  });
}

/**
 * `/api/presets` (signed in, any role):
 * - `GET /` → `{ presets: [{ id, title, summary, card, meter, subdivision }] }`;
 * - `GET /:id` → `{ preset }`, or 404 `not_found`.
 */
export function createPresetsRouter(views: readonly PresetView[]): Router {
  const byId = new Map(views.map((view) => [view.id, view]));
  const router = Router();

  router.get('/', requireSignIn, (_req, res) => {
    res.json({ presets: views });
  });

  router.get('/:id', requireSignIn, validate({ params: presetParams }), (req, res) => {
    const preset = byId.get(req.params['id'] as string);
    if (!preset) throw notFound('There is no preset rule card with that id.');
    res.json({ preset });
  });

  return router;
}
