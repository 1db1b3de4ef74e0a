import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';

import { AUTH_SIGN_IN_URL, AuthSession } from '../core/auth-session';
import { SessionUser } from '../core/user';
import {
  RECENT_DRILLS_KEY,
  RECENT_DRILLS_LIMIT,
  RecentDrills,
  parseEntries,
} from './recent-drills';

const TOMASZ: SessionUser = {
  id: 2,
  email: 'tomasz.reyes@larkspur.test',
  name: 'Tomasz Reyes',
  role: 'teacher',
};
const HANA: SessionUser = {
  id: 3,
  email: 'hana.lindqvist@larkspur.test',
  name: 'Hana Lindqvist',
  role: 'teacher',
};

describe('RecentDrills', () => {
  let backend: HttpTestingController;

  beforeEach(() => {
    localStorage.clear();
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(),
        provideHttpClientTesting(),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    backend.verify();
    localStorage.clear();
  });

  async function signInAs(person: SessionUser): Promise<void> {
    const signedIn = firstValueFrom(TestBed.inject(AuthSession).signIn(person.email, 'demo'));
    backend.expectOne(AUTH_SIGN_IN_URL).flush({ user: person });
    await signedIn;
  }

  const at = (minute: number) => new Date(Date.UTC(2026, 2, 14, 17, minute));

  it('lists drills newest first and moves a reopened drill back to the top', async () => {
    await signInAs(TOMASZ);
    const recent = TestBed.inject(RecentDrills);
    recent.record({ cardId: 'early-backbeat', title: 'Early backbeat', seed: 'amber-1' }, at(0));
    recent.record({ cardId: 'linear-sixteenths', title: 'Linear', seed: 'fern-2' }, at(1));
    recent.record({ cardId: 'early-backbeat', title: 'Early backbeat', seed: 'amber-9' }, at(2));
    recent.record({ cardId: 'early-backbeat', title: 'Early backbeat', seed: 'amber-1' }, at(3));

    expect(recent.entries().map((e) => `${e.cardId} ${e.seed}`)).toEqual([
      'early-backbeat amber-1',
      'early-backbeat amber-9',
      'linear-sixteenths fern-2',
    ]);
    expect(recent.entries()[0]?.openedAt).toBe('2026-03-14T17:03:00.000Z');
  });

  it(`keeps only the ${RECENT_DRILLS_LIMIT} most recent`, async () => {
    await signInAs(TOMASZ);
    const recent = TestBed.inject(RecentDrills);
    for (let i = 0; i < RECENT_DRILLS_LIMIT + 5; i++) {
      recent.record({ cardId: 'early-backbeat', title: 'Early backbeat', seed: `s-${i}` }, at(i));
    }
    const seeds = recent.entries().map((e) => e.seed);
    expect(seeds).toHaveLength(RECENT_DRILLS_LIMIT);
    expect(seeds[0]).toBe(`s-${RECENT_DRILLS_LIMIT + 4}`);
    expect(seeds.at(-1)).toBe('s-5');
  });

  it('survives a reload (reads what an earlier page stored) and clears it', async () => {
    await signInAs(TOMASZ);
    localStorage.setItem(
      `${RECENT_DRILLS_KEY}.2`,
      JSON.stringify([
        {
          cardId: 'four-over-three',
          title: 'Four over three',
          seed: 'x',
          openedAt: at(5).toISOString(),
        },
      ]),
    );
    const recent = TestBed.inject(RecentDrills);
    expect(recent.entries().map((e) => e.title)).toEqual(['Four over three']);

    recent.clear();
    expect(recent.entries()).toEqual([]);
    expect(localStorage.getItem(`${RECENT_DRILLS_KEY}.2`)).toBeNull();
  });

  it('keeps each account’s list apart on a shared computer', async () => {
    await signInAs(TOMASZ);
    const recent = TestBed.inject(RecentDrills);
    recent.record({ cardId: 'early-backbeat', title: 'Early backbeat', seed: 'tomasz' }, at(0));
    await signInAs(HANA);
    expect(recent.entries()).toEqual([]);
    recent.record({ cardId: 'early-backbeat', title: 'Early backbeat', seed: 'hana' }, at(1));
    await signInAs(TOMASZ);
    expect(recent.entries().map((e) => e.seed)).toEqual(['tomasz']);
  });

  it('remembers nothing while signed out', () => {
    const recent = TestBed.inject(RecentDrills);
    recent.record({ cardId: 'early-backbeat', title: 'Early backbeat', seed: 'x' }, at(0));
    expect(recent.entries()).toEqual([]);
    expect(localStorage.length).toBe(0);
  });

  it('picks up a list written by another tab', async () => {
    await signInAs(TOMASZ);
    const recent = TestBed.inject(RecentDrills);
    expect(recent.entries()).toEqual([]);
    const key = `${RECENT_DRILLS_KEY}.2`;
    const value = JSON.stringify([
      {
        cardId: 'ride-with-foot-on-2-and-4',
        title: 'Ride',
        seed: 'y',
        openedAt: at(7).toISOString(),
      },
    ]);
    localStorage.setItem(key, value);
    window.dispatchEvent(new StorageEvent('storage', { key, newValue: value }));
    expect(recent.entries().map((e) => e.seed)).toEqual(['y']);
  });
});

describe('parseEntries', () => {
  const good = { cardId: 'a', title: 'A', seed: 's', openedAt: '2026-03-14T17:00:00.000Z' };

  it('reads nothing from missing, broken or non-list text', () => {
    expect(parseEntries(null)).toEqual([]);
    expect(parseEntries('{not json')).toEqual([]);
    expect(parseEntries('{"cardId":"a"}')).toEqual([]);
  });

  it('drops malformed entries and keeps the good ones in order', () => {
    const stored = [
      good,
      { ...good, seed: '' },
      { ...good, openedAt: 'yesterday-ish' },
      { ...good, cardId: 42 },
      null,
      { ...good, cardId: 'x'.repeat(500) },
      { ...good, seed: 't' },
    ];
    expect(parseEntries(JSON.stringify(stored)).map((e) => e.seed)).toEqual(['s', 't']);
  });
});
