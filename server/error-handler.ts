import type { ErrorRequestHandler, RequestHandler } from 'express';
import { HttpError } from './http-error';
import { errorFields, type Logger } from './logger';

/** body-parser's error types, mapped onto the API's error codes. */
const BODY_ERRORS: Record<string, { code: string; message: string }> = {
  'entity.parse.failed': { code: 'invalid_json', message: 'The request body is not valid JSON.' },
  'entity.too.large': { code: 'payload_too_large', message: 'The request body is too large.' },
  'encoding.unsupported': {
    code: 'unsupported_encoding',
    message: 'The request body uses an encoding the server does not accept.',
  },
  'charset.unsupported': {
    code: 'unsupported_charset',
    message: 'The request body uses a character set the server does not accept.',
  },
  'request.aborted': { code: 'request_aborted', message: 'The request was aborted.' },
};

interface BodyParserError {
  type: string;
  status: number;
}

function isBodyParserError(error: unknown): error is BodyParserError {
  const candidate = error as Partial<BodyParserError> | null;
  return (
    typeof candidate?.type === 'string' &&
    typeof candidate.status === 'number' &&
    candidate.type in BODY_ERRORS
  );
}

/** JSON 404 for any `/api/*` path that no router answered. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(
    new HttpError(
      404,
      'not_found',
      `There is no API route ${req.method} ${req.originalUrl.split('?')[0]}.`,
    ),
  );
};

/**
 * The one error middleware: every failure becomes `{ error: { code, message, details? } }`.
 * Unexpected errors are logged in full and answered with a plain 500, never a stack trace.
 */
export function errorHandler(logger: Logger): ErrorRequestHandler {
  return (error: unknown, req, res, next) => {
    if (res.headersSent) {
      next(error);
      return;
    }
    const httpError = toHttpError(error);
    if (httpError.status >= 500) {
      logger.error('Request failed', { method: req.method, path: req.path, ...errorFields(error) });
    }
    res.status(httpError.status).json(httpError.toBody());
  };
}

function toHttpError(error: unknown): HttpError {
  if (error instanceof HttpError) return error;
  if (isBodyParserError(error)) {
    const known = BODY_ERRORS[error.type]!;
    return new HttpError(error.status, known.code, known.message);
  }
  return new HttpError(
    500,
    'internal_error',
    'Something went wrong on the server. Please try again.',
  );
}
