import { z } from 'zod';
import type { ErrorDetail } from '../http-error';
import { HttpError } from '../http-error';
import { levelSchema, tagsSchema, titleSchema, type Level } from './card-fields';

/** The file format name and version of an exported rule card. */
export const ENVELOPE_FORMAT = 'tensile.rule-card';
export const ENVELOPE_VERSION = 1;

/** Largest rule card file accepted on import. */
export const IMPORT_LIMIT_BYTES = 64 * 1024;

/** An exported rule card, as written to and read from a file. */
export interface RuleCardEnvelope {
  readonly format: typeof ENVELOPE_FORMAT;
  readonly version: typeof ENVELOPE_VERSION;
  readonly title: string;
  readonly tags: readonly string[];
  readonly level: Level | null;
  readonly card: unknown;
}

const FIELDS = ['format', 'version', 'title', 'tags', 'level', 'card'] as const;

const envelopeSchema = z.object({
  title: titleSchema,
  tags: tagsSchema.default([]),
  level: levelSchema.nullable().default(null),
  card: z.unknown().refine((card) => card !== undefined, 'The file has no rule card ("card").'),
});

/**
 * Reads an imported file. The format and version are checked first, so a file from elsewhere (or
 * from a later Tensile) is refused with one sentence that says so rather than a list of fields;
 * then unknown fields and each field's value, one detail per problem.
 */
export function readEnvelope(body: unknown): Omit<RuleCardEnvelope, 'format' | 'version'> {
  const input = (body ?? {}) as Record<string, unknown>;
  if (input['format'] !== ENVELOPE_FORMAT) {
    throw refusal(
      'wrong_format',
      `This is not a Tensile rule card file: its "format" must be "${ENVELOPE_FORMAT}".`,
      'body.format',
    );
  }
  if (input['version'] !== ENVELOPE_VERSION) {
    throw refusal(
      'unsupported_version',
      `This rule card file has version ${JSON.stringify(input['version'] ?? null)}; this Tensile reads version ${ENVELOPE_VERSION}.`,
      'body.version',
    );
  }
  const details: ErrorDetail[] = Object.keys(input)
    .filter((key) => !(FIELDS as readonly string[]).includes(key))
    .map((key) => ({
      path: `body.${key}`,
      message: `Unknown field "${key}": a rule card file holds ${FIELDS.join(', ')}.`,
    }));
  const parsed = envelopeSchema.safeParse(input);
  if (!parsed.success) {
    details.push(
      ...parsed.error.issues.map((issue) => ({
        path: ['body', ...issue.path.map(String)].join('.'),
        message: issue.message,
      })),
    );
  }
  if (details.length > 0 || !parsed.success) {
    throw new HttpError(
      400,
      'invalid_rule_card_file',
      details.length === 1
        ? details[0]!.message
        : 'The rule card file has fields that are not valid.',
      details,
    );
  }
  return parsed.data;
}

export function writeEnvelope(
  card: Omit<RuleCardEnvelope, 'format' | 'version'>,
): RuleCardEnvelope {
  return {
    format: ENVELOPE_FORMAT,
    version: ENVELOPE_VERSION,
    title: card.title,
    tags: card.tags,
    level: card.level,
    card: card.card,
  };
}

function refusal(code: string, message: string, path: string): HttpError {
  return new HttpError(400, code, message, [{ path, message }]);
}
