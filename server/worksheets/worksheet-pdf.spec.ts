import http from 'node:http';
import { PDFParse } from 'pdf-parse';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { findBuiltInPreset } from '../../shared/generator/presets/index';
import type { WorksheetPrint } from '../pdf/worksheet-print';
import { createTestApp, findAccount, type TestApp } from '../testing/test-app';

/** Stands in for the renderer: never finishes on its own, and records being cancelled. */
const slow = { started: 0, aborted: 0 };
async function slowRender(print: WorksheetPrint, signal?: AbortSignal): Promise<Buffer> {
  slow.started += 1;
  return new Promise((_resolve, reject) => {
    signal?.addEventListener('abort', () => {
      slow.aborted += 1;
      reject(signal.reason as Error);
    });
  });
}

let t: TestApp;
let slowApp: TestApp;
beforeAll(async () => {
  t = await createTestApp({ env: { PUBLIC_URL: 'http://tensile.larkspur.test' } });
  slowApp = await createTestApp({ deps: { renderWorksheetPdf: slowRender } });
});
afterAll(async () => {
  await t.close();
  await slowApp.close();
});

const TOMASZ = 'tomasz.reyes@larkspur.test';

/** supertest's parser for a binary body (its type names superagent's Response, a stream here). */
function binary(res: request.Response, done: (error: Error | null, body: Buffer) => void) {
  const stream = res as unknown as http.IncomingMessage;
  const chunks: Buffer[] = [];
  stream.on('data', (chunk: Buffer) => chunks.push(chunk));
  stream.on('end', () => done(null, Buffer.concat(chunks)));
}

async function pdfText(bytes: Buffer): Promise<string> {
  const parser = new PDFParse({ data: new Uint8Array(bytes) });
  try {
    return (await parser.getText()).text;
  } finally {
    await parser.destroy();
  }
}

async function sheetOfTwo(agent: request.Agent): Promise<number> {
  const card = structuredClone(findBuiltInPreset('early-backbeat')!.card);
  const saved = await agent
    .post('/api/drills')
    .send({ title: 'Leaning backbeat for Juno', card, seed: 'juno-1' });
  const drillId = saved.body.drill.id as number;
  const link = await agent.post(`/api/drills/${drillId}/share`);
  expect(link.status).toBe(201);
  const sheet = await agent.post('/api/worksheets').send({
    title: 'Week two: leaning in',
    notes: 'Ten minutes each, with breaks.',
    items: [
      { source: { kind: 'saved', drillId }, ladder: { start: 60, target: 72, step: 4 } },
      { source: { kind: 'preset', presetId: 'four-over-three', seed: 'week-2' } },
    ],
  });
  expect(sheet.status, JSON.stringify(sheet.body)).toBe(201);
  return sheet.body.worksheet.id as number;
}

describe('worksheet PDF', () => {
  it('prints the stored worksheet: titles, studio, notes and every drill’s link', async () => {
    const tomasz = await t.signIn(TOMASZ);
    const id = await sheetOfTwo(tomasz);
    const shared = (await tomasz.get('/api/drills?q=Leaning')).body.items[0].id as number;
    const code = (await tomasz.get(`/api/drills/${shared}`)).body.drill.shareLink.code as string;

    const res = await tomasz.get(`/api/worksheets/${id}/pdf`).buffer(true).parse(binary);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect(res.headers['content-disposition']).toBe('attachment; filename=week-two-leaning-in.pdf');
    const bytes = res.body as Buffer;
    expect(bytes.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const text = (await pdfText(bytes)).replace(/\s+/g, ' ');
    expect(text).toContain('Week two: leaning in');
    expect(text).toContain('Ten minutes each, with breaks.');
    // No studio branding yet: the teacher's name heads the sheet.
    expect(text).toContain('Tomasz Reyes');
    expect(text).toContain('Leaning backbeat for Juno');
    expect(text).toContain(`${findBuiltInPreset('four-over-three')!.title} (seed week-2)`);
    // A shared saved drill prints its public link; a preset its drill page at the seed.
    expect(text).toContain(`http://tensile.larkspur.test/s/${code}`);
    expect(text).toContain('http://tensile.larkspur.test/drills/four-over-three?seed=week-2');
    // The worksheet's own paper (A4 by default): 595.28 × 841.89 points.
    expect(bytes.toString('latin1')).toMatch(/\/MediaBox \[0 0 595\.2\d* 841\.8\d*\]/);
  });

  it('prints on US Letter when asked, under the studio’s own name once it has one', async () => {
    const tomasz = await t.signIn(TOMASZ);
    const id = await sheetOfTwo(tomasz);
    const named = await tomasz.put('/api/branding').send({ studioName: 'Larkspur Rhythm School' });
    expect(named.status).toBe(200);
    const res = await tomasz
      .get(`/api/worksheets/${id}/pdf?paper=letter`)
      .buffer(true)
      .parse(binary);
    expect(res.status).toBe(200);
    // US Letter is 8.5 × 11 in = 612 × 792 points (common practice).
    expect((res.body as Buffer).toString('latin1')).toMatch(/\/MediaBox \[0 0 612 792\]/);
    const text = (await pdfText(res.body as Buffer)).replace(/\s+/g, ' ');
    expect(text).toContain('Larkspur Rhythm School');
    expect(text).not.toContain('Tomasz Reyes');
  });

  it('answers 400, 403, 404 and 409 before drawing anything', async () => {
    const tomasz = await t.signIn(TOMASZ);
    const hana = await t.signIn('hana.lindqvist@larkspur.test');
    const student = await t.signIn('student');
    const admin = await t.signIn('admin');
    const empty = await tomasz.post('/api/worksheets').send({ title: 'Nothing yet' });
    const url = `/api/worksheets/${empty.body.worksheet.id}/pdf`;
    const none = await tomasz.get(url);
    expect(none.status).toBe(409);
    expect(none.body.error).toEqual({
      code: 'empty_worksheet',
      message: 'This worksheet has no drills to print yet.',
    });
    const bad = await tomasz.get(`${url}?paper=a3`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('query.paper');
    expect((await hana.get(url)).status).toBe(404);
    expect((await student.get(url)).status).toBe(403);
    expect((await admin.get(url)).status).toBe(403);
    expect((await request(t.app).get(url)).status).toBe(401);
  });

  it('says which drill cannot print when its preset was withdrawn', async () => {
    const tomasz = await t.signIn(TOMASZ);
    const admin = await t.signIn('admin');
    const sheet = await tomasz.post('/api/worksheets').send({
      title: 'Soon withdrawn',
      items: [
        { source: { kind: 'preset', presetId: 'four-over-three', seed: 'a' } },
        { source: { kind: 'preset', presetId: 'six-eight-groove', seed: 'b' } },
      ],
    });
    await admin.put('/api/presets/six-eight-groove').send({ published: false });
    const res = await tomasz.get(`/api/worksheets/${sheet.body.worksheet.id}/pdf`);
    await admin.put('/api/presets/six-eight-groove').send({ published: true });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('not_printable');
    expect(res.body.error.message).toMatch(/^Drill 2 can no longer be printed/);
  });

  it('stops laying out the PDF when the teacher cancels the download', async () => {
    const agent = await slowApp.signIn(TOMASZ);
    const id = await sheetOfTwo(agent);
    const base = await slowApp.listen();
    const account = findAccount(TOMASZ);
    const signIn = await fetch(`${base}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: account.email, password: account.password }),
    });
    const cookie = signIn.headers.get('set-cookie')!.split(';')[0]!;
    const download = http.get(`${base}/api/worksheets/${id}/pdf`, { headers: { cookie } });
    download.on('error', () => undefined);
    await until(() => slow.started === 1);
    expect(slow.aborted).toBe(0);
    download.destroy();
    await until(() => slow.aborted === 1);
    // The server keeps answering after a cancelled download.
    expect((await agent.get(`/api/worksheets/${id}`)).status).toBe(200);
  });
});

async function until(condition: () => boolean, ms = 5000): Promise<void> {
  const end = Date.now() + ms;
  while (!condition()) {
    if (Date.now() > end) throw new Error('Timed out waiting');
    await new Promise((resolve) => setTimeout(resolve, 10));
  }
}
