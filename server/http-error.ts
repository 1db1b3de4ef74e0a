/** One problem with one input field, as listed in an error response's `details`. */
export interface ErrorDetail {
  /** Dotted path of the field, e.g. `body.email`. */
  readonly path: string;
  readonly message: string;
}

/** The body of every error response: `{ error: { code, message, details? } }`. */
export interface ErrorBody {
  readonly error: {
    readonly code: string;
    readonly message: string;
    readonly details?: readonly ErrorDetail[];
  };
}

/**
 * An error that maps directly onto an HTTP response. `message` is a readable sentence shown to
 * the user; `code` is a stable machine-readable word.
 */
export class HttpError extends Error {
  override readonly name = 'HttpError';

  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: readonly ErrorDetail[],
  ) {
    super(message);
  }

  /** The JSON body sent for this error. */
  toBody(): ErrorBody {
    const error = { code: this.code, message: this.message };
    return { error: this.details ? { ...error, details: this.details } : error };
  }
}

/** 404 for a resource that does not exist. */
export function notFound(message: string): HttpError {
  return new HttpError(404, 'not_found', message);
}
