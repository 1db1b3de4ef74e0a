import type { Page } from 'playwright-core';
import { generateDrill, parseRuleCard } from '../../shared/generator/index';

/**
 * Serves preset `id` with another bar count: its card in `GET /api/presets/:id`, and in
 * `GET /api/presets/:id/drill` the drill the server would give that card at the seed asked for
 * (generated here with the same engine, since the server only knows the stored card).
 */
export async function servePresetWithBars(page: Page, id: string, bars: number): Promise<void> {
  const presetPath = `/api/presets/${encodeURIComponent(id)}`;
  const withBars = async (url: string, route: Parameters<Parameters<Page['route']>[1]>[0]) => {
    const response = await route.fetch({ url });
    const body = (await response.json()) as { preset: { card: Record<string, unknown> } };
    body.preset.card = { ...body.preset.card, bars };
    return { response, body };
  };
  await page.route(
    (url) => url.pathname === presetPath,
    async (route) => {
      const { response, body } = await withBars(route.request().url(), route);
      await route.fulfill({ response, json: body });
    },
  );
  await page.route(
    (url) => url.pathname === `${presetPath}/drill`,
    async (route) => {
      const asked = new URL(route.request().url());
      const seed = asked.searchParams.get('seed') ?? '';
      const { body } = await withBars(`${asked.origin}${presetPath}`, route);
      const drill = generateDrill(parseRuleCard(body.preset.card), seed);
      await route.fulfill({ status: 200, json: { drill } });
    },
  );
}
