import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateDrill, parseRuleCard } from '../../shared/generator/index';
import { findBuiltInPreset } from '../../shared/generator/presets/index';
import type { PublicUser } from '../auth/roles';
import { UsersRepository } from '../auth/users-repository';
import { engineGenerator } from '../drills/drill-generator';
import { DrillsRepository } from '../drills/drills-repository';
import { HttpError } from '../http-error';
import { PresetsRepository } from '../presets/presets-repository';
import { createTestApp, findAccount, type TestApp } from '../testing/test-app';
import { drillSourceSchema, resolveDrillSource, type DrillSourceDeps } from './drill-source';

let t: TestApp;
let deps: DrillSourceDeps;
beforeAll(async () => {
  t = await createTestApp();
  deps = {
    presets: new PresetsRepository(t.db),
    drills: new DrillsRepository(t.db),
    generate: engineGenerator,
  };
});
afterAll(async () => {
  await t.close();
});

async function user(who: string): Promise<PublicUser> {
  const row = await new UsersRepository(t.db).findByEmail(findAccount(who).email);
  return (await new UsersRepository(t.db).findActiveById(row!.id))!;
}

const presetCard = (id: string) => structuredClone(findBuiltInPreset(id)!.card);

/** The HttpError a promise rejects with. */
async function refusal(promise: Promise<unknown>): Promise<HttpError> {
  const error = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(HttpError);
  return error as HttpError;
}

describe('drillSourceSchema', () => {
  it('accepts the three kinds', () => {
    for (const source of [
      { kind: 'preset', presetId: 'six-eight-groove', seed: 'a' },
      { kind: 'saved', drillId: 3 },
      { kind: 'card', card: {}, seed: 'b', keep: [] },
    ]) {
      expect(drillSourceSchema.safeParse(source).success, JSON.stringify(source)).toBe(true);
    }
  });

  it('refuses an unknown kind, unknown fields and missing seeds with readable messages', () => {
    const kind = drillSourceSchema.safeParse({ kind: 'file', presetId: 'x' });
    expect(kind.error?.issues[0]?.message).toBe(
      'The drill source needs a kind: "preset", "saved" or "card".',
    );
    expect(drillSourceSchema.safeParse({ kind: 'saved', drillId: 1, seed: 'x' }).success).toBe(
      false,
    );
    const seed = drillSourceSchema.safeParse({ kind: 'preset', presetId: 'x', seed: ' ' });
    expect(seed.error?.issues[0]?.message).toBe('Give a seed.');
    const id = drillSourceSchema.safeParse({ kind: 'saved', drillId: 1.5 });
    expect(id.error?.issues[0]?.message).toBe('The saved drill id is a whole number.');
    expect(drillSourceSchema.safeParse({ kind: 'card', seed: 'x' }).success).toBe(false);
  });
});

describe('resolveDrillSource', () => {
  it('generates a preset at the seed and links to its drill page', async () => {
    const student = await user('student');
    const resolved = await resolveDrillSource(deps, student, {
      kind: 'preset',
      presetId: 'six-eight-groove',
      seed: 'lesson 2',
    });
    const card = parseRuleCard(presetCard('six-eight-groove'));
    expect(resolved.title).toBe(findBuiltInPreset('six-eight-groove')!.title);
    expect(resolved.seed).toBe('lesson 2');
    expect(resolved.card).toEqual(card);
    expect(JSON.stringify(resolved.drill)).toBe(JSON.stringify(generateDrill(card, 'lesson 2')));
    expect(resolved.link).toBe('/drills/six-eight-groove?seed=lesson%202');
  });

  it('answers 404 for an unknown preset and for a withdrawn one unless the user is the admin', async () => {
    const teacher = await user('teacher');
    const missing = await refusal(
      resolveDrillSource(deps, teacher, { kind: 'preset', presetId: 'nope', seed: 'a' }),
    );
    expect(missing.status).toBe(404);
    await t.db('presets').where({ id: 'four-over-three' }).update({ published: false });
    try {
      const source = { kind: 'preset', presetId: 'four-over-three', seed: 'a' } as const;
      expect((await refusal(resolveDrillSource(deps, teacher, source))).status).toBe(404);
      const admin = await resolveDrillSource(deps, await user('admin'), source);
      expect(admin.title).toBe('Four over three');
    } finally {
      await t.db('presets').where({ id: 'four-over-three' }).update({ published: true });
    }
  });

  it('serves a saved drill from its snapshot to its owner only', async () => {
    const hana = await t.signIn('hana.lindqvist@larkspur.test');
    const saved = await hana.post('/api/drills').send({
      title: 'Quintuplets for Juno',
      card: presetCard('quintuplets-hihat-1-3-4'),
      seed: 'q',
    });
    expect(saved.status).toBe(201);
    const id = saved.body.drill.id as number;
    const resolved = await resolveDrillSource(deps, await user('hana.lindqvist@larkspur.test'), {
      kind: 'saved',
      drillId: id,
    });
    expect(resolved).toMatchObject({ title: 'Quintuplets for Juno', seed: 'q' });
    expect(resolved.link).toBe(`/saved-drills/${id}`);
    expect(resolved.drill).toEqual(saved.body.drill.snapshot);
    expect(resolved.card).toEqual(saved.body.drill.snapshot.card);

    const other = await refusal(
      resolveDrillSource(deps, await user('tomasz.reyes@larkspur.test'), {
        kind: 'saved',
        drillId: id,
      }),
    );
    expect(other.status).toBe(404);
    expect(other.message).toBe('There is no saved drill with that id among yours.');
  });

  it('generates a card with its pinned bars, and refuses a bad card with a 400 under the source', async () => {
    const teacher = await user('teacher');
    const raw = presetCard('four-over-three');
    const first = generateDrill(parseRuleCard(raw), 'k');
    const keep = [{ ...first.bars[1]!, bar: 1 }];
    const resolved = await resolveDrillSource(deps, teacher, {
      kind: 'card',
      card: raw,
      seed: 'other',
      keep,
    });
    expect(resolved.drill.bars[0]!.hits).toEqual(first.bars[1]!.hits);
    expect(resolved.link).toBe('/drills');
    expect(resolved.title).toBe('Drill, seed other');

    const bad = await refusal(
      resolveDrillSource(deps, teacher, {
        kind: 'card',
        card: { ...(raw as object), tempo: 1000 },
        seed: 'x',
      }),
    );
    expect(bad.status).toBe(400);
    expect(bad.code).toBe('invalid_rule_card');
    expect(bad.details?.[0]?.path).toBe('body.source.card.tempo');

    const badKeep = await refusal(
      resolveDrillSource(deps, teacher, {
        kind: 'card',
        card: raw,
        seed: 'x',
        keep: [{ ...first.bars[0]!, bar: 9 }],
      }),
    );
    expect(badKeep.status).toBe(400);
    expect(badKeep.details?.[0]?.path).toMatch(/^body\.source\.keep/);
  });
});
