import { HttpErrorResponse } from '@angular/common/http';
import { apiErrorMessage } from '../core/api-error-message';
import type { DrillResult } from './drill-result';

/**
 * A drill the server refused (`GET /api/presets/:id/drill`), with the heading the page shows for
 * each of the engine's refusals; the same words as when the browser ran the engine itself.
 */
export function drillFailure(error: unknown): DrillResult & { readonly status: 'error' } {
  const message = apiErrorMessage(error, 'Please try another seed.');
  switch (errorCode(error)) {
    case 'invalid_rule_card':
      return { status: 'error', heading: 'This rule card needs a change', message };
    case 'rule_conflict':
      return {
        status: 'error',
        heading: 'These rules cannot all hold at once',
        message: `${message} Relax one of them on the rule card.`,
      };
    case 'search_exhausted':
      return { status: 'error', heading: 'Try another seed', message };
    default:
      return { status: 'error', heading: 'The drill could not be generated', message };
  }
}

function errorCode(error: unknown): string | null {
  if (!(error instanceof HttpErrorResponse)) return null;
  const body: unknown = error.error;
  if (typeof body !== 'object' || body === null || !('error' in body)) return null;
  const inner = (body as { error: unknown }).error;
  if (typeof inner !== 'object' || inner === null || !('code' in inner)) return null;
  const code = (inner as { code: unknown }).code;
  return typeof code === 'string' ? code : null;
}
