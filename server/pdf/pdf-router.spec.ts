import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { createCanvas } from '@napi-rs/canvas';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { findBuiltInPreset } from '../../shared/generator/presets/index';
import { findPhrase, pdfOnDisk, pdfText } from '../../tests/support/pdf-inspect';
import { createTestApp, type TestApp } from '../testing/test-app';

const run = promisify(execFile);
const SLOW = 240_000;
let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ env: { PUBLIC_URL: 'http://tensile.larkspur.test' } });
});
afterAll(async () => {
  await t.close();
});

const TOMASZ = 'tomasz.reyes@larkspur.test';
const HANA = 'hana.lindqvist@larkspur.test';

const binary = (res: request.Response, done: (error: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (chunk: Buffer) => chunks.push(chunk));
  res.on('end', () => done(null, Buffer.concat(chunks)));
};

describe('POST /api/pdf/drill', () => {
  it(
    'streams a preset drill as a PDF download, with the studio, logo and absolute seed link',
    async () => {
      const tomasz = await t.signIn(TOMASZ);
      await tomasz.put('/api/branding').send({ studioName: 'Larkspur East Studio' });
      const canvas = createCanvas(240, 80);
      canvas.getContext('2d').fillRect(0, 20, 240, 40);
      await tomasz
        .put('/api/branding/logo')
        .attach('logo', canvas.toBuffer('image/png'), 'logo.png');
      const res = await tomasz
        .post('/api/pdf/drill')
        .send({
          source: { kind: 'preset', presetId: 'early-backbeat', seed: 'week 3' },
          paper: 'letter',
          ladder: { start: 70, target: 90, step: 10 },
        })
        .buffer(true)
        .parse(binary);
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toBe('application/pdf');
      expect(res.headers['content-disposition']).toBe('attachment; filename=early-backbeat.pdf');
      const file = await pdfOnDisk(res.body as Buffer);
      try {
        const text = await pdfText(file.path);
        expect(text.pages[0]).toEqual({ width: 612, height: 792 });
        expect(findPhrase(text, 'Early backbeat').length).toBeGreaterThan(0);
        expect(findPhrase(text, 'Larkspur East Studio')).toHaveLength(1);
        const link = 'http://tensile.larkspur.test/drills/early-backbeat?seed=week%203';
        expect(text.words.some((w) => w.text === link)).toBe(true);
        // The ladder's rungs: 70, 80, 90.
        expect(findPhrase(text, '70 80 90')).toHaveLength(1);
        const { stdout } = await run('pdfimages', ['-list', file.path]);
        // Rows after the two header lines; a PNG's alpha comes as a second, "smask" row.
        const images = stdout
          .trim()
          .split('\n')
          .slice(2)
          .filter((row) => row.trim().split(/\s+/)[2] === 'image');
        expect(images, 'one embedded image: the logo').toHaveLength(1);
        expect(images[0]!.trim().split(/\s+/).slice(3, 5)).toEqual(['240', '80']);
      } finally {
        await file.dispose();
      }
    },
    SLOW,
  );

  it(
    'prints a saved drill for its teacher only, with the teacher’s name as studio by default',
    async () => {
      const hana = await t.signIn(HANA);
      const card = structuredClone(findBuiltInPreset('linear-sixteenths')!.card);
      const saved = await hana.post('/api/drills').send({
        title: 'Linear study, week 2',
        card: { ...(card as object), bars: 2 },
        seed: 'linear-2',
      });
      expect(saved.status, JSON.stringify(saved.body)).toBe(201);
      const source = { kind: 'saved', drillId: saved.body.drill.id };
      const tomasz = await t.signIn(TOMASZ);
      const other = await tomasz.post('/api/pdf/drill').send({ source });
      expect(other.status).toBe(404);
      const res = await hana
        .post('/api/pdf/drill')
        .send({ source, aids: { sticking: false, counts: false, tension: false } })
        .buffer(true)
        .parse(binary);
      expect(res.status).toBe(200);
      const file = await pdfOnDisk(res.body as Buffer);
      try {
        const text = await pdfText(file.path);
        expect(text.pages[0]!.width).toBeCloseTo(595.28, 1);
        expect(findPhrase(text, 'Linear study, week 2').length).toBeGreaterThan(0);
        expect(findPhrase(text, 'Hana Lindqvist')).toHaveLength(1);
        expect(text.words.some((w) => w.text === 'Tension')).toBe(false);
        const link = `http://tensile.larkspur.test/saved-drills/${saved.body.drill.id}`;
        expect(text.words.some((w) => w.text === link)).toBe(true);
      } finally {
        await file.dispose();
      }
    },
    SLOW,
  );

  it('answers 400 with the field for a bad request, 404 for an unknown preset, 403 for students', async () => {
    const tomasz = await t.signIn(TOMASZ);
    const post = (body: object) => tomasz.post('/api/pdf/drill').send(body);
    const source = { kind: 'preset', presetId: 'early-backbeat', seed: 'x' };
    for (const [body, path] of [
      [{}, 'body.source'],
      [{ source, paper: 'a3' }, 'body.paper'],
      [{ source, ladder: { start: 60, target: 900, step: 5 } }, 'body.ladder.target'],
      [{ source, aids: { sticking: 'yes', counts: true, tension: true } }, 'body.aids.sticking'],
      [{ source: { kind: 'card', card: { bars: 0 }, seed: 'x' } }, 'body.source.card'],
    ] as const) {
      const res = await post(body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      const paths = (res.body.error.details as { path: string }[]).map((d) => d.path);
      expect(
        paths.some((p) => p.startsWith(path)),
        `${path} in ${paths.join(', ')}`,
      ).toBe(true);
    }
    const unknown = await post({ source: { ...source, presetId: 'no-such-preset' } });
    expect(unknown.status).toBe(404);
    const student = await t.signIn('student');
    expect((await student.post('/api/pdf/drill').send({ source })).status).toBe(403);
    expect((await t.agent().post('/api/pdf/drill').send({ source })).status).toBe(401);
  });
});
