import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { HttpError, type ErrorDetail } from './http-error';

/** Schemas for the parts of a request that a route accepts. */
export interface RequestSchemas {
  body?: z.ZodType;
  params?: z.ZodType;
  query?: z.ZodType;
}

/**
 * Validates the request against zod schemas before the handler runs; on failure responds 400
 * `validation_failed` listing each bad field. Parsed values replace the raw ones, so handlers
 * see coerced, defaulted data.
 */
export function validate(schemas: RequestSchemas): RequestHandler {
  return (req, _res, next) => {
    const details: ErrorDetail[] = [];
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part];
      if (!schema) continue;
      const result = schema.safeParse(req[part]);
      if (!result.success) {
        details.push(...result.error.issues.map((issue) => toDetail(part, issue)));
      } else if (part === 'query') {
        // Express 5 exposes req.query as a getter; shadow it with the parsed value.
        Object.defineProperty(req, 'query', { value: result.data, writable: true });
      } else {
        req[part] = result.data as never;
      }
    }
    if (details.length > 0) {
      next(new HttpError(400, 'validation_failed', summary(details), details));
      return;
    }
    next();
  };
}

/**
 * The error's one-line message: the fields' own sentences when there are few (a client that
 * shows only this line then says what is wrong, e.g. how long a password may be), a summary
 * when there are many.
 */
function summary(details: readonly ErrorDetail[]): string {
  const messages = [...new Set(details.map((detail) => detail.message))];
  return messages.length <= MESSAGES_IN_SUMMARY
    ? messages.join(' ')
    : 'Some fields are missing or not valid.';
}

/** Field messages quoted in the summary line before it just says that some are wrong. */
const MESSAGES_IN_SUMMARY = 3;

function toDetail(part: string, issue: z.core.$ZodIssue): ErrorDetail {
  const path = [part, ...issue.path.map(String)].join('.');
  return { path, message: issue.message };
}
