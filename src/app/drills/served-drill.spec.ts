import { HttpErrorResponse } from '@angular/common/http';
import { describe, expect, it } from 'vitest';

import { drillFailure } from './served-drill';

function refusal(code: string, message: string): HttpErrorResponse {
  return new HttpErrorResponse({ status: 400, error: { error: { code, message } } });
}

describe('drillFailure', () => {
  it('heads each engine refusal as the page did when the browser ran the engine', () => {
    expect(drillFailure(refusal('invalid_rule_card', 'Tempo is at most 320.'))).toEqual({
      status: 'error',
      heading: 'This rule card needs a change',
      message: 'Tempo is at most 320.',
    });
    expect(drillFailure(refusal('rule_conflict', 'Linear and backbeat collide.'))).toEqual({
      status: 'error',
      heading: 'These rules cannot all hold at once',
      message: 'Linear and backbeat collide. Relax one of them on the rule card.',
    });
    expect(drillFailure(refusal('search_exhausted', 'No drill found.'))).toEqual({
      status: 'error',
      heading: 'Try another seed',
      message: 'No drill found.',
    });
  });

  it('says plainly when the server cannot be reached or fails', () => {
    const offline = drillFailure(new HttpErrorResponse({ status: 0 }));
    expect(offline.heading).toBe('The drill could not be generated');
    expect(offline.message).toContain('cannot reach its server');
    const broken = drillFailure(new HttpErrorResponse({ status: 500, error: 'oops' }));
    expect(broken.heading).toBe('The drill could not be generated');
    expect(broken.message).toContain('server had a problem');
  });
});
