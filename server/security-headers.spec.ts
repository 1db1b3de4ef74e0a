import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from './testing/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ seed: false });
});
afterAll(async () => {
  await t.close();
});

function directives(header: string): Map<string, string[]> {
  return new Map(
    header
      .split(';')
      .map((part) => part.trim().split(/\s+/))
      .filter((words) => words[0])
      .map(([name, ...values]) => [name!, values]),
  );
}

describe('security headers', () => {
  it('sends a CSP allowing only this origin, data: fonts/images and blob: workers', async () => {
    const res = await request(t.app).get('/api/health');
    const csp = directives(res.headers['content-security-policy'] as string);
    expect(csp.get('default-src')).toEqual(["'self'"]);
    expect(csp.get('script-src')).toEqual(["'self'", 'blob:']);
    expect(csp.get('script-src-attr')).toEqual(["'none'"]);
    expect(csp.get('style-src')).toEqual(["'self'", "'unsafe-inline'"]);
    expect(csp.get('font-src')).toEqual(["'self'", 'data:']);
    expect(csp.get('connect-src')).toEqual(["'self'"]);
    expect(csp.get('object-src')).toEqual(["'none'"]);
    expect(csp.get('frame-ancestors')).toEqual(["'none'"]);
    // No directive lets in another host.
    for (const values of csp.values()) {
      for (const value of values)
        expect(value).toMatch(/^('self'|'none'|'unsafe-inline'|data:|blob:)$/);
    }
    // Plain http (local use): no forced upgrade to https.
    expect(csp.has('upgrade-insecure-requests')).toBe(false);
  });

  it('hides the framework and forbids MIME sniffing', async () => {
    const res = await request(t.app).get('/api/health');
    expect(res.headers['x-powered-by']).toBeUndefined();
    expect(res.headers['x-content-type-options']).toBe('nosniff');
  });
});
