import fc from 'fast-check';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseRuleCard } from '../../shared/generator/index';
import type { Drill } from '../../shared/generator/index';
import { grooveFile, rockGroove } from '../../shared/formats/midi-import/testing/groove-file';
import { createTestApp, type TestApp } from '../testing/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

const groove = Buffer.from(rockGroove(2, 100));

function upload(agent: request.Agent, bytes: Uint8Array, fields: Record<string, string> = {}) {
  const req = agent.post('/api/imports/midi');
  for (const [name, value] of Object.entries(fields)) req.field(name, value);
  return req.attach('file', Buffer.from(bytes), {
    filename: 'groove.mid',
    contentType: 'audio/midi',
  });
}

async function savedDrillCount(): Promise<number> {
  const row = (await t.db('saved_drills').count({ n: '*' }).first()) as { n: number | string };
  return Number(row.n);
}

describe('POST /api/imports/midi (preview)', () => {
  it('answers the drill, the inferred card, residuals, tensions and warnings; stores nothing', async () => {
    const before = await savedDrillCount();
    const teacher = await t.signIn('teacher');
    const res = await upload(teacher, groove);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const { drill, card, residuals, tensions, warnings, tracks } = res.body.groove;
    expect(drill.bars).toHaveLength(2);
    expect(parseRuleCard(card)).toEqual(card);
    expect(card.ostinato).toMatchObject({ voice: 'hihat', slots: [0, 2] });
    expect(residuals).toHaveLength(8);
    expect(residuals[0]).toEqual({ bar: 1, beat: 1, slots: 2, notes: 3, beats: 0, ms: 0 });
    expect(tensions).toEqual(drill.bars.map((b: { tension: number }) => b.tension));
    expect(warnings).toEqual([]);
    expect(tracks).toEqual([{ index: 0, name: '', channel: 10, notes: 26 }]);
    expect(await savedDrillCount()).toBe(before);
  });

  it('reads the track chosen in the form', async () => {
    const teacher = await t.signIn('teacher');
    const onPianoChannel = grooveFile({
      bpm: 90,
      channel: 0,
      notes: [
        { key: 36, at: 0 },
        { key: 38, at: 1 },
      ],
    });
    const refused = await upload(teacher, onPianoChannel);
    expect(refused.status).toBe(400);
    expect(refused.body.error.code).toBe('no_drum_notes');
    const chosen = await upload(teacher, onPianoChannel, { track: '0' });
    expect(chosen.status).toBe(200);
    expect(chosen.body.groove.track).toBe(0);
    const missing = await upload(teacher, onPianoChannel, { track: '4' });
    expect(missing.status).toBe(400);
    expect(missing.body.error).toMatchObject({
      code: 'no_such_track',
      details: [{ path: 'body.track' }],
    });
  });

  it.each([
    [
      'not MIDI',
      new TextEncoder().encode('not a MIDI file at all'),
      'not_midi',
      /not a Standard MIDI File/,
    ],
    ['truncated', groove.subarray(0, groove.length - 7), 'truncated', /cut short/],
    ['no notes', grooveFile({ bpm: 90, notes: [] }), 'no_notes', /no notes/],
    [
      'no drum notes',
      grooveFile({ bpm: 90, notes: [{ key: 56, at: 0 }] }),
      'no_drum_notes',
      /drum-set sound/,
    ],
    [
      'over 64 bars',
      grooveFile({
        bpm: 90,
        notes: [
          { key: 36, at: 0 },
          { key: 36, at: 70 * 4 },
        ],
      }),
      'too_long',
      /71 bars; a drill holds at most 64/,
    ],
  ])('refuses a file that is %s with 400 and the reason', async (_name, bytes, code, message) => {
    const before = await savedDrillCount();
    const teacher = await t.signIn('teacher');
    const res = await upload(teacher, bytes);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe(code);
    expect(res.body.error.message).toMatch(message);
    expect(await savedDrillCount()).toBe(before);
  });

  it('refuses a file of more notes than any groove holds with 400', async () => {
    const teacher = await t.signIn('teacher');
    const notes = Array.from({ length: 20_001 }, (_, i) => ({ key: 42, at: (i % 128) / 8 }));
    const res = await upload(teacher, grooveFile({ bpm: 90, notes }));
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'too_many_notes' });
    expect(res.body.error.message).toMatch(/more than 20,000 notes/);
  });

  it('refuses a file over 1 MB with 400, not 500', async () => {
    const teacher = await t.signIn('teacher');
    const big = new Uint8Array(1024 * 1024 + 1);
    big.set(groove);
    const res = await upload(teacher, big);
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({
      code: 'file_too_large',
      message: 'A MIDI file may be at most 1 MB.',
    });
  });

  it('refuses a request without a file, a file in another field, and unknown fields', async () => {
    const teacher = await t.signIn('teacher');
    const none = await teacher.post('/api/imports/midi').send({ track: 1 });
    expect(none.status).toBe(400);
    expect(none.body.error.code).toBe('file_missing');
    const other = await teacher
      .post('/api/imports/midi')
      .attach('upload', groove, { filename: 'groove.mid' });
    expect(other.status).toBe(400);
    expect(other.body.error.code).toBe('invalid_upload');
    const extra = await upload(teacher, groove, { colour: 'red' });
    expect(extra.status).toBe(400);
    expect(extra.body.error.code).toBe('validation_failed');
    const badTrack = await upload(teacher, groove, { track: 'drums' });
    expect(badTrack.status).toBe(400);
    expect(badTrack.body.error.details[0].path).toBe('body.track');
  });

  it('refuses a broken multipart body with 400', async () => {
    const teacher = await t.signIn('teacher');
    const res = await teacher
      .post('/api/imports/midi')
      .set('Content-Type', 'multipart/form-data; boundary=xyz')
      .send('--xyz\r\nContent-Disposition: form-data; name="file"; filename="a.mid"\r\n\r\nMThd');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_upload');
  });

  it('is for teachers only: 401 signed out, 403 for students and admins', async () => {
    expect((await upload(t.agent(), groove)).status).toBe(401);
    expect((await upload(await t.signIn('student'), groove)).status).toBe(403);
    expect((await upload(await t.signIn('admin'), groove)).status).toBe(403);
    const save = (agent: request.Agent) =>
      agent.post('/api/imports/midi/save').field('title', 'x').attach('file', groove, 'g.mid');
    expect((await save(t.agent())).status).toBe(401);
    expect((await save(await t.signIn('student'))).status).toBe(403);
    expect((await save(await t.signIn('admin'))).status).toBe(403);
  });

  it('answers fuzzed files with 400s only', async () => {
    const teacher = await t.signIn('teacher');
    const header = [0x4d, 0x54, 0x68, 0x64, 0, 0, 0, 6, 0, 1, 0, 1, 1, 0xe0];
    const bytes = fc.oneof(
      fc.uint8Array({ minLength: 1, maxLength: 120 }),
      fc.uint8Array({ maxLength: 120 }).map((tail) => new Uint8Array([...header, ...tail])),
      fc.nat({ max: groove.length - 1 }).map((cut) => groove.subarray(0, cut + 1)),
    );
    await fc.assert(
      fc.asyncProperty(bytes, async (input) => {
        const res = await upload(teacher, input);
        expect([200, 400]).toContain(res.status);
        if (res.status === 400) expect(typeof res.body.error.message).toBe('string');
      }),
      { numRuns: 25 },
    );
  });
});

describe('POST /api/imports/midi/save', () => {
  it("stores the imported drill as the teacher's saved drill, snapshot as imported", async () => {
    const teacher = await t.signIn('teacher');
    const preview = (await upload(teacher, groove)).body.groove as { drill: Drill };
    const res = await teacher
      .post('/api/imports/midi/save')
      .field('title', 'Imported rock groove')
      .field('notes', 'From a lesson file.')
      .attach('file', groove, { filename: 'groove.mid' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const drill = res.body.drill;
    expect(drill).toMatchObject({
      title: 'Imported rock groove',
      notes: 'From a lesson file.',
      seed: 'imported',
      ruleCardId: null,
      presetId: null,
    });
    expect(drill.snapshot).toEqual(preview.drill);
    expect(drill.card).toEqual(preview.drill.card);
    const read = await teacher.get(`/api/drills/${drill.id}`);
    expect(read.status).toBe(200);
    expect(read.body.drill.snapshot).toEqual(preview.drill);
    const other = await t.signIn('hana.lindqvist@larkspur.test');
    expect((await other.get(`/api/drills/${drill.id}`)).status).toBe(404);
  });

  it('refuses a bad file or a missing title with 400 and stores nothing', async () => {
    const before = await savedDrillCount();
    const teacher = await t.signIn('teacher');
    const bad = await teacher
      .post('/api/imports/midi/save')
      .field('title', 'Broken')
      .attach('file', Buffer.from('RIFF....WAVE'), { filename: 'a.mid' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('not_midi');
    const untitled = await teacher.post('/api/imports/midi/save').attach('file', groove, 'g.mid');
    expect(untitled.status).toBe(400);
    expect(untitled.body.error.details[0].path).toBe('body.title');
    expect(await savedDrillCount()).toBe(before);
  });
});
