import { HttpErrorResponse } from '@angular/common/http';

/**
 * Turns a failed request into a sentence a person can act on. The server answers errors as
 * `{ error: { code, message } }`; anything else (network down, proxy page) gets a plain fallback.
 */
export function apiErrorMessage(
  error: unknown,
  fallback = 'Something went wrong. Please try again.',
): string {
  if (error instanceof HttpErrorResponse) {
    const message = serverMessage(error.error);
    if (message) return message;
    if (error.status === 0) {
      return 'Tensile cannot reach its server. Check your connection and try again.';
    }
    if (error.status >= 500) return 'The server had a problem. Please try again in a moment.';
    return fallback;
  }
  if (error instanceof Error && error.message) return error.message;
  return fallback;
}

function serverMessage(body: unknown): string | null {
  if (typeof body !== 'object' || body === null || !('error' in body)) return null;
  const inner = (body as { error: unknown }).error;
  if (typeof inner === 'object' && inner !== null && 'message' in inner) {
    const message = (inner as { message: unknown }).message;
    if (typeof message === 'string' && message.trim()) return message;
  }
  return null;
}
