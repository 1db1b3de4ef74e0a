import type { RequestHandler } from 'express';
import { HttpError } from '../http-error';
import { jsonBody } from '../json-body';
import { IMPORT_LIMIT_BYTES } from './rule-card-envelope';

/**
 * The JSON parser for rule card imports, mounted before the common one: a file over 64 KB is
 * refused before it is parsed, with a sentence that says the limit.
 */
export function importBody(): RequestHandler {
  const parse = jsonBody({ limit: `${IMPORT_LIMIT_BYTES}b` });
  return (req, res, next) => {
    parse(req, res, (error?: unknown) => {
      if ((error as { type?: unknown } | undefined)?.type === 'entity.too.large') {
        next(
          new HttpError(
            413,
            'payload_too_large',
            `A rule card file may be at most ${IMPORT_LIMIT_BYTES / 1024} KB.`,
          ),
        );
        return;
      }
      next(error);
    });
  };
}
