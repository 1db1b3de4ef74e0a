import http from 'node:http';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { DrawingCache } from '../pdf/drawing-cache';
import type { EngravingJob } from '../pdf/engraving-pool';
import { engraveNotation } from '../pdf/notation-art';
import { printEngraver } from '../pdf/print-engraver';
import { createTestApp, type TestApp } from '../testing/test-app';

/** Engraves in this thread (the real drawings), counting every drill it is asked for. */
const engraved: EngravingJob[] = [];
const cache = new DrawingCache(64 * 1024 * 1024);
const engraver = printEngraver((jobs) => {
  engraved.push(...jobs);
  return Promise.resolve(jobs.map((j) => engraveNotation(j.drill, j.aids, j.maxAspect)));
}, cache);

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ deps: { printEngraver: engraver } });
});
afterAll(() => t.close());

function binary(res: request.Response, done: (error: Error | null, body: Buffer) => void) {
  const stream = res as unknown as http.IncomingMessage;
  const chunks: Buffer[] = [];
  stream.on('data', (chunk: Buffer) => chunks.push(chunk));
  stream.on('end', () => done(null, Buffer.concat(chunks)));
}

const item = (seed: string, aids = { sticking: true, counts: true, tension: true }) => ({
  source: { kind: 'preset', presetId: 'early-backbeat', seed },
  aids,
});

/** Background work ends once the cache holds `drawings` and nothing more is being engraved. */
const drawn = (drawings: number) =>
  vi.waitFor(() => expect(cache.size).toBe(drawings), { timeout: 60_000, interval: 20 });

describe('worksheet drawings engraved while the worksheet is composed', () => {
  it('engraves a drill when it is added, so the export engraves nothing', async () => {
    const tomasz = await t.signIn('tomasz.reyes@larkspur.test');
    const sheet = await tomasz
      .post('/api/worksheets')
      .send({ title: 'Week 3', items: [item('a')] });
    expect(sheet.status).toBe(201);
    const id = sheet.body.worksheet.id as number;
    await drawn(1);
    expect(engraved).toHaveLength(1);

    // A drill added later is engraved as it is added; the first is not engraved again.
    const more = await tomasz.put(`/api/worksheets/${id}`).send({ items: [item('a'), item('b')] });
    expect(more.status).toBe(200);
    await drawn(2);
    expect(engraved.map((job) => job.drill.seed)).toEqual(['a', 'b']);

    const pdf = await tomasz.get(`/api/worksheets/${id}/pdf`).buffer(true).parse(binary);
    expect(pdf.status).toBe(200);
    expect((pdf.body as Buffer).subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(engraved).toHaveLength(2);

    // A changed print option is another drawing: engraved in the background, then printed.
    const fewer = { sticking: false, counts: true, tension: true };
    await tomasz.put(`/api/worksheets/${id}`).send({ items: [item('a', fewer), item('b')] });
    await drawn(3);
    expect(engraved).toHaveLength(3);
    expect(engraved[2]!.aids).toEqual(fewer);
    await tomasz.get(`/api/worksheets/${id}/pdf`).buffer(true).parse(binary);
    expect(engraved).toHaveLength(3);
  }, 120_000);

  it('engraves on demand when nothing is kept, and again when the worksheet is opened', async () => {
    const tomasz = await t.signIn('tomasz.reyes@larkspur.test');
    cache.clear();
    const sheet = await tomasz
      .post('/api/worksheets')
      .send({ title: 'Week 4', items: [item('c')] });
    const id = sheet.body.worksheet.id as number;
    await drawn(1);
    const before = engraved.length;

    // The server restarted, or the drawings were pushed out: the export engraves them itself.
    cache.clear();
    const pdf = await tomasz.get(`/api/worksheets/${id}/pdf`).buffer(true).parse(binary);
    expect(pdf.status).toBe(200);
    expect(engraved).toHaveLength(before + 1);

    cache.clear();
    expect((await tomasz.get(`/api/worksheets/${id}`)).status).toBe(200);
    await drawn(1);
    expect(engraved).toHaveLength(before + 2);
  }, 120_000);
});
