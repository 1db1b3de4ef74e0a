import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Midi } from '../../shared/formats/tonejs-midi';
import { generateDrill, parseRuleCard } from '../../shared/generator/index';
import { findBuiltInPreset } from '../../shared/generator/presets/index';
import { createTestApp, type TestApp } from '../testing/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

/** Collects a binary answer as a Buffer (supertest only parses text types by default). */
function binary(res: request.Response, done: (error: Error | null, body: Buffer) => void) {
  const chunks: Buffer[] = [];
  res.on('data', (chunk: Buffer) => chunks.push(chunk));
  res.on('end', () => done(null, Buffer.concat(chunks)));
}

const preset = { kind: 'preset', presetId: 'six-eight-groove', seed: 'lesson 2' } as const;
const card = (id: string) => structuredClone(findBuiltInPreset(id)!.card);

describe('POST /api/exports/midi', () => {
  it('sends a preset drill as a MIDI download named after its title and seed', async () => {
    const student = await t.signIn('student');
    const res = await student
      .post('/api/exports/midi')
      .send({ source: preset })
      .buffer(true)
      .parse(binary);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('audio/midi');
    expect(res.headers['content-disposition']).toBe(
      'attachment; filename=6-8-groove-in-two-lesson-2.mid',
    );
    const midi = new Midi(res.body as Buffer);
    const drill = generateDrill(parseRuleCard(card('six-eight-groove')), 'lesson 2');
    const hits = drill.bars.reduce((n, bar) => n + bar.hits.length, 0);
    expect(midi.tracks[0]!.notes).toHaveLength(hits);
    expect(midi.header.name).toBe('6/8 groove in two');
  });

  it('answers 401 when signed out', async () => {
    const res = await request(t.app).post('/api/exports/midi').send({ source: preset });
    expect(res.status).toBe(401);
    const xml = await request(t.app).post('/api/exports/musicxml').send({ source: preset });
    expect(xml.status).toBe(401);
  });

  it('refuses a missing or malformed source with a 400 that says what is wrong', async () => {
    const teacher = await t.signIn('teacher');
    const none = await teacher.post('/api/exports/midi').send({});
    expect(none.status).toBe(400);
    expect(none.body.error.code).toBe('validation_failed');
    expect(none.body.error.details[0].path).toBe('body.source');
    const kind = await teacher.post('/api/exports/midi').send({ source: { kind: 'pdf' } });
    expect(kind.status).toBe(400);
    expect(kind.body.error.details[0].message).toBe(
      'The drill source needs a kind: "preset", "saved" or "card".',
    );
    const extra = await teacher.post('/api/exports/midi').send({ source: preset, format: 'x' });
    expect(extra.status).toBe(400);
    const bad = await teacher.post('/api/exports/midi').send({
      source: {
        kind: 'card',
        card: { ...(card('four-over-three') as object), tempo: 900 },
        seed: 'a',
      },
    });
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('invalid_rule_card');
    expect(bad.body.error.details[0].path).toBe('body.source.card.tempo');
    const text = await teacher
      .post('/api/exports/midi')
      .set('Content-Type', 'application/json')
      .send('{"source":');
    expect(text.status).toBe(400);
  });

  it('answers 404 for an unknown preset and 405 for a GET', async () => {
    const teacher = await t.signIn('teacher');
    const res = await teacher
      .post('/api/exports/midi')
      .send({ source: { kind: 'preset', presetId: 'no-such-card', seed: 'a' } });
    expect(res.status).toBe(404);
    expect((await teacher.get('/api/exports/midi')).status).toBe(405);
  });
});

describe('POST /api/exports/musicxml', () => {
  it('sends a card drill as a MusicXML download', async () => {
    const teacher = await t.signIn('teacher');
    const res = await teacher
      .post('/api/exports/musicxml')
      .send({ source: { kind: 'card', card: card('quintuplets-hihat-1-3-4'), seed: 'five' } });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/vnd\.recordare\.musicxml\+xml/);
    expect(res.headers['content-disposition']).toBe(
      'attachment; filename=drill-seed-five.musicxml',
    );
    expect(res.text).toContain('<score-partwise version="4.0">');
    expect(res.text).toContain('<actual-notes>5</actual-notes>');
  });

  it('exports a teacher’s own saved drill and answers 404 to another teacher and a student', async () => {
    const hana = await t.signIn('hana.lindqvist@larkspur.test');
    const saved = await hana
      .post('/api/drills')
      .send({ title: 'Septuplets – week 3', card: card('four-over-three'), seed: 'w3' });
    expect(saved.status).toBe(201);
    const source = { kind: 'saved', drillId: saved.body.drill.id as number };

    const own = await hana.post('/api/exports/musicxml').send({ source });
    expect(own.status).toBe(200);
    expect(own.headers['content-disposition']).toBe(
      'attachment; filename=septuplets-week-3.musicxml',
    );
    expect(own.text).toContain('<work-title>Septuplets – week 3</work-title>');

    const tomasz = await t.signIn('tomasz.reyes@larkspur.test');
    for (const format of ['midi', 'musicxml']) {
      const other = await tomasz.post(`/api/exports/${format}`).send({ source });
      expect(other.status).toBe(404);
      expect(other.body.error.message).toBe('There is no saved drill with that id among yours.');
    }
    const student = await t.signIn('student');
    expect((await student.post('/api/exports/midi').send({ source })).status).toBe(404);
  });
});
