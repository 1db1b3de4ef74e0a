import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import {
  checkDrill,
  ENGINE_VERSION,
  generateDrill,
  parseRuleCard,
} from '../../shared/generator/index';
import { GOLDEN_CASES } from './cases';

const dir = join(dirname(fileURLToPath(import.meta.url)), 'drills');
const HOW =
  'If the change is intended, bump ENGINE_VERSION in shared/generator/version.ts and run `npx tsx tests/golden/update.ts`.';

describe('golden drills', () => {
  it('has at least 20 cases, one file each', () => {
    expect(GOLDEN_CASES.length).toBeGreaterThanOrEqual(20);
    const files = readdirSync(dir)
      .filter((f) => f.endsWith('.json'))
      .sort();
    expect(files).toEqual(GOLDEN_CASES.map((c) => `${c.name}.json`).sort());
  });

  it.each(GOLDEN_CASES.map((c) => [c.name, c] as const))(
    '%s reproduces byte for byte',
    (_name, c) => {
      const file = join(dir, `${c.name}.json`);
      expect(existsSync(file), `Missing golden file ${file}. ${HOW}`).toBe(true);
      const stored = readFileSync(file, 'utf8');
      const storedEngine = (JSON.parse(stored) as { engine: string }).engine;
      expect(
        storedEngine,
        `Golden file made by engine ${storedEngine}, engine is now ${ENGINE_VERSION}: run \`npx tsx tests/golden/update.ts\`.`,
      ).toBe(ENGINE_VERSION);
      const card = parseRuleCard(c.card);
      const drill = generateDrill(card, c.seed);
      expect(checkDrill(card, drill)).toEqual([]);
      expect(
        `${JSON.stringify(drill)}\n` === stored,
        `The drill for ${c.name} changed while ENGINE_VERSION stayed ${ENGINE_VERSION}. ${HOW}`,
      ).toBe(true);
    },
  );
});
