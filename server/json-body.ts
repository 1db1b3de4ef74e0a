import express, { type RequestHandler } from 'express';
import { HttpError } from './http-error';

/** Options of {@link jsonBody}. */
export interface JsonBodyOptions {
  /** Largest body accepted, as body-parser reads it (e.g. `'256kb'`). */
  readonly limit: string;
}

/**
 * Parses JSON request bodies and insists each is a JSON object: every API body is an object, so
 * that fields can be added later without breaking clients. A top-level `null`, string, number or
 * array is answered 400 `invalid_body`, with a message that says so rather than calling valid
 * JSON invalid (body-parser's strict mode would report it as a syntax error).
 *
 * A body whose `Content-Encoding` says gzip/deflate/br but that does not decompress is answered
 * 400 `invalid_body_encoding`: the zlib failure is the client's, not the server's.
 */
export function jsonBody(options: JsonBodyOptions): RequestHandler {
  const parse = express.json({ limit: options.limit, strict: false });
  return (req, res, next) => {
    parse(req, res, (error?: unknown) => {
      if (error) {
        next(isDecompressionError(error, req.headers['content-encoding']) ? badEncoding() : error);
        return;
      }
      // `undefined` means no JSON body was sent (no body, or another content type).
      if (req.body !== undefined && !isJsonObject(req.body)) {
        next(new HttpError(400, 'invalid_body', 'The request body must be a JSON object.'));
        return;
      }
      next();
    });
  };
}

function isJsonObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/**
 * body-parser tags each of its own and raw-body's failures with a `type`; a 400 without one is
 * the stream itself failing, which with a content encoding means the decompressor rejected it
 * (zlib "incorrect header check", "unexpected end of file", brotli "Decompression failed").
 */
function isDecompressionError(error: unknown, contentEncoding: string | undefined): boolean {
  const candidate = error as { status?: unknown; type?: unknown } | null;
  const encoding = (contentEncoding ?? 'identity').trim().toLowerCase();
  return encoding !== 'identity' && candidate?.status === 400 && candidate.type === undefined;
}

function badEncoding(): HttpError {
  return new HttpError(400, 'invalid_body_encoding', 'The request body could not be decompressed.');
}
