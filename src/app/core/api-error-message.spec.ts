import { HttpErrorResponse } from '@angular/common/http';
import { describe, expect, it } from 'vitest';

import { apiErrorMessage } from './api-error-message';

describe('apiErrorMessage', () => {
  it("reads the server's { error: { message } }", () => {
    const error = new HttpErrorResponse({
      status: 400,
      error: { error: { code: 'bad_request', message: 'Tempo must be between 20 and 320.' } },
    });
    expect(apiErrorMessage(error)).toBe('Tempo must be between 20 and 320.');
  });

  it('explains an unreachable server', () => {
    expect(apiErrorMessage(new HttpErrorResponse({ status: 0 }))).toMatch(
      /cannot reach its server/,
    );
  });

  it('falls back for bodies without a message', () => {
    const error = new HttpErrorResponse({ status: 404, error: '<html>Not found</html>' });
    expect(apiErrorMessage(error, 'That drill no longer exists.')).toBe(
      'That drill no longer exists.',
    );
    expect(apiErrorMessage(new HttpErrorResponse({ status: 502, error: {} }))).toMatch(
      /server had a problem/,
    );
  });
});
