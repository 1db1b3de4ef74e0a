import { STATUS_CODES } from 'node:http';
import type { ErrorRequestHandler, RequestHandler } from 'express';
import { isDatabaseBusy } from './db-errors';
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

/** Seconds a client is asked to wait after a 503 for a busy database. */
const RETRY_AFTER_BUSY_S = 5;

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
    // A busy database or session store usually answers again within seconds.
    if (httpError.status === 503) res.setHeader('Retry-After', String(RETRY_AFTER_BUSY_S));
    res.status(httpError.status).json(httpError.toBody());
  };
}

/**
 * The 4xx status a library error carries (http-errors sets `status` and `statusCode`), if any.
 * Such an error is the client's: answering it 500 would blame the server and page whoever is on
 * call for a malformed request.
 */
function clientErrorStatus(error: unknown): number | undefined {
  const candidate = error as { status?: unknown; statusCode?: unknown } | null;
  const status = candidate?.status ?? candidate?.statusCode;
  return Number.isInteger(status) && (status as number) >= 400 && (status as number) <= 499
    ? (status as number)
    : undefined;
}

/**
 * Maps any thrown value onto the response sent. Library 4xx messages are not echoed: they are
 * written for developers and may quote the input back (e.g. the undecodable path segment).
 */
function toHttpError(error: unknown): HttpError {
  if (error instanceof HttpError) return error;
  if (isDatabaseBusy(error)) {
    return new HttpError(
      503,
      'service_unavailable',
      'The server is busy just now. Please try again in a moment.',
    );
  }
  if (isBodyParserError(error)) {
    const known = BODY_ERRORS[error.type]!;
    return new HttpError(error.status, known.code, known.message);
  }
  const status = clientErrorStatus(error);
  // The router marks a path segment that decodeURIComponent rejects (e.g. `%E0%A4%A`) as a 400.
  if (status === 400 && error instanceof URIError) {
    return new HttpError(400, 'invalid_path', 'The address contains malformed percent-encoding.');
  }
  if (status !== undefined) {
    const reason = STATUS_CODES[status] ?? 'Client Error';
    const code = reason.toLowerCase().replace(/[^a-z]+/g, '_');
    return new HttpError(
      status,
      code,
      `The server could not accept this request (${status} ${reason}).`,
    );
  }
  return new HttpError(
    500,
    'internal_error',
    'Something went wrong on the server. Please try again.',
  );
}
