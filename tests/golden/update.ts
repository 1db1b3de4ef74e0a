/**
 * Regenerates the golden drills: `npx tsx tests/golden/update.ts`. Run it only after a deliberate
 * change to the engine's output, together with a bump of ENGINE_VERSION.
 */
import { mkdirSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { generateDrill, parseRuleCard } from '../../shared/generator/index';
import { GOLDEN_CASES } from './cases';

const dir = join(dirname(fileURLToPath(import.meta.url)), 'drills');
mkdirSync(dir, { recursive: true });
for (const file of readdirSync(dir)) if (file.endsWith('.json')) rmSync(join(dir, file));
for (const c of GOLDEN_CASES) {
  const drill = generateDrill(parseRuleCard(c.card), c.seed);
  writeFileSync(join(dir, `${c.name}.json`), `${JSON.stringify(drill)}\n`);
}
console.log(`Wrote ${GOLDEN_CASES.length} golden drills to ${dir}`);
