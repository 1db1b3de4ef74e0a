/**
 * Command line: generate a drill from a rule card and print it as JSON.
 *
 *   npm run generate -- --card card.json --seed lesson-12
 *   npm run generate -- --preset kick-off-the-one --seed lesson-12
 *
 * A bad card or a card whose rules conflict prints the engine's readable message to stderr and
 * exits with status 1; a usage mistake exits with status 2.
 */
import { readFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import {
  generateDrill,
  parseRuleCard,
  RuleCardError,
  RuleConflictError,
  SearchExhaustedError,
} from '../../shared/generator/index';
import { BUILT_IN_PRESETS, findBuiltInPreset } from '../../shared/generator/presets/index';

const USAGE = `Usage: npm run generate -- (--card FILE | --preset ID) [--seed SEED] [--compact]

Generates a drill from a rule card and prints it as JSON.

  --card FILE     a rule card in JSON
  --preset ID     a built-in rule card instead (${BUILT_IN_PRESETS.map((p) => p.id).join(', ')})
  --seed SEED     the seed (default "1"); the same card and seed give the same drill
  --compact       print the JSON on one line
  --help          show this help`;

class UsageError extends Error {}

function readCard(values: { card?: string | undefined; preset?: string | undefined }): unknown {
  if (values.card !== undefined && values.preset !== undefined) {
    throw new UsageError('Give either --card or --preset, not both.');
  }
  if (values.preset !== undefined) {
    const preset = findBuiltInPreset(values.preset);
    if (!preset) throw new UsageError(`There is no built-in preset "${values.preset}".`);
    return preset.card;
  }
  if (values.card === undefined)
    throw new UsageError('Give a rule card with --card FILE or --preset ID.');
  let text: string;
  try {
    text = readFileSync(values.card, 'utf8');
  } catch {
    throw new UsageError(`Cannot read the card file "${values.card}".`);
  }
  try {
    return JSON.parse(text) as unknown;
  } catch (error) {
    throw new RuleCardError('invalid_json', [
      {
        path: '',
        message: `The card file "${values.card}" is not valid JSON (${(error as Error).message}).`,
      },
    ]);
  }
}

/** Runs the command; returns the exit status. */
export function main(argv: readonly string[]): number {
  try {
    const { values } = parseArgs({
      args: [...argv],
      options: {
        card: { type: 'string' },
        preset: { type: 'string' },
        seed: { type: 'string', default: '1' },
        compact: { type: 'boolean', default: false },
        help: { type: 'boolean', short: 'h', default: false },
      },
      strict: true,
      allowPositionals: false,
    });
    if (values.help) {
      process.stdout.write(`${USAGE}\n`);
      return 0;
    }
    const drill = generateDrill(parseRuleCard(readCard(values)), values.seed);
    process.stdout.write(`${JSON.stringify(drill, null, values.compact ? undefined : 2)}\n`);
    return 0;
  } catch (error) {
    if (
      error instanceof RuleCardError ||
      error instanceof RuleConflictError ||
      error instanceof SearchExhaustedError
    ) {
      process.stderr.write(`${error.message}\n`);
      return 1;
    }
    if (
      error instanceof UsageError ||
      (error as { code?: string }).code?.startsWith('ERR_PARSE_ARGS')
    ) {
      process.stderr.write(`${(error as Error).message}\n\n${USAGE}\n`);
      return 2;
    }
    throw error;
  }
}

process.exitCode = main(process.argv.slice(2));
