import { HttpErrorResponse } from '@angular/common/http';
import { apiErrorMessage } from '../core/api-error-message';

/**
 * The server's message followed by one line per bad field (`details`), so an import that fails
 * says every field to fix, not just the first.
 */
export function apiErrorWithDetails(error: unknown): string {
  const message = apiErrorMessage(error);
  if (!(error instanceof HttpErrorResponse)) return message;
  const details = (error.error as { error?: { details?: unknown } } | null)?.error?.details;
  if (!Array.isArray(details)) return message;
  const lines = details.flatMap((detail: unknown) => {
    if (typeof detail !== 'object' || detail === null) return [];
    const { path, message: text } = detail as { path?: unknown; message?: unknown };
    if (typeof text !== 'string') return [];
    return [typeof path === 'string' && path ? `${path}: ${text}` : text];
  });
  return [message, ...lines].join(' · ');
}
