import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';

import { drillCardId, drillSeed, startEarlyDrill, startEarlyPreset } from './drill-prefetch';
import { DrillsApi } from './drills-api';

const PRESET = {
  id: 'early-backbeat',
  title: 'Early backbeat',
  summary: 'Snare a sixteenth before 2 and 4.',
  card: { meter: '4/4' },
  meter: '4/4',
  subdivision: 'sixteenths',
};

describe('drillCardId', () => {
  it('reads the card id of a drill page path and nothing else', () => {
    expect(drillCardId('/drills/early-backbeat')).toBe('early-backbeat');
    expect(drillCardId('/drills/early-backbeat/')).toBe('early-backbeat');
    expect(drillCardId('/drills/a%20b')).toBe('a b');
    expect(drillCardId('/drills')).toBeNull();
    expect(drillCardId('/drills/')).toBeNull();
    expect(drillCardId('/saved-drills/3')).toBeNull();
    expect(drillCardId('/drills/a/b')).toBeNull();
    expect(drillCardId('/drills/%E0%A4%A')).toBeNull();
  });
});

describe('drillSeed', () => {
  it('reads the seed as the page uses it: trimmed, at most 64 characters, none when blank', () => {
    expect(drillSeed('?seed=harbor-spark-21')).toBe('harbor-spark-21');
    expect(drillSeed('?seed=%20a%20b%20')).toBe('a b');
    expect(drillSeed(`?seed=${'x'.repeat(70)}`)).toBe('x'.repeat(64));
    expect(drillSeed('?seed=%20')).toBeNull();
    expect(drillSeed('')).toBeNull();
  });
});

describe('DrillsApi.preset with a request started before the app booted', () => {
  let api: DrillsApi;
  let http: HttpTestingController;
  const fetchMock = vi.fn<typeof fetch>();

  beforeEach(() => {
    vi.stubGlobal('fetch', fetchMock);
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(),
        provideHttpClientTesting(),
      ],
    });
    api = TestBed.inject(DrillsApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    http.verify();
    fetchMock.mockReset();
    vi.unstubAllGlobals();
  });

  it('uses the early answer once, then asks the server itself', async () => {
    fetchMock.mockResolvedValue(Response.json({ preset: PRESET }));
    startEarlyPreset('early-backbeat');
    expect(fetchMock).toHaveBeenCalledWith('/api/presets/early-backbeat', expect.anything());

    await expect(firstValueFrom(api.preset('early-backbeat'))).resolves.toEqual(PRESET);
    http.expectNone('/api/presets/early-backbeat');

    const again = firstValueFrom(api.preset('early-backbeat'));
    http.expectOne('/api/presets/early-backbeat').flush({ preset: PRESET });
    await expect(again).resolves.toEqual(PRESET);
  });

  it('falls back to its own request when the early one failed, so the error is reported', async () => {
    fetchMock.mockResolvedValue(Response.json({ error: { code: 'not_found' } }, { status: 404 }));
    startEarlyPreset('nope');
    const answer = firstValueFrom(api.preset('nope'));
    const request = await vi.waitFor(() => http.expectOne('/api/presets/nope'));
    request.flush(
      { error: { code: 'not_found', message: 'There is no preset rule card with that id.' } },
      { status: 404, statusText: 'Not Found' },
    );
    await expect(answer).rejects.toMatchObject({ status: 404 });
  });

  it('ignores an early answer for another card', async () => {
    fetchMock.mockResolvedValue(Response.json({ preset: PRESET }));
    startEarlyPreset('early-backbeat');
    const answer = firstValueFrom(api.preset('four-over-three'));
    const other = { ...PRESET, id: 'four-over-three' };
    http.expectOne('/api/presets/four-over-three').flush({ preset: other });
    await expect(answer).resolves.toEqual(other);
  });
});

describe('DrillsApi.drill', () => {
  let api: DrillsApi;
  let http: HttpTestingController;
  const fetchMock = vi.fn<typeof fetch>();
  const DRILL = { seed: 'harbor-spark-21', bars: [{ bar: 1 }] };

  beforeEach(() => {
    vi.stubGlobal('fetch', fetchMock);
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(),
        provideHttpClientTesting(),
      ],
    });
    api = TestBed.inject(DrillsApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    http.verify();
    fetchMock.mockReset();
    vi.unstubAllGlobals();
  });

  it('asks the server for the preset’s drill at the seed', async () => {
    const answer = firstValueFrom(api.drill('early backbeat', 'a b'));
    http.expectOne('/api/presets/early%20backbeat/drill?seed=a%20b').flush({ drill: DRILL });
    await expect(answer).resolves.toEqual(DRILL);
  });

  it('uses the early answer once when it is the drill at that seed', async () => {
    fetchMock.mockResolvedValue(Response.json({ drill: DRILL }));
    startEarlyDrill('early-backbeat', 'harbor-spark-21');
    expect(fetchMock).toHaveBeenCalledWith(
      '/api/presets/early-backbeat/drill?seed=harbor-spark-21',
      expect.anything(),
    );
    await expect(firstValueFrom(api.drill('early-backbeat', 'harbor-spark-21'))).resolves.toEqual(
      DRILL,
    );
    http.expectNone('/api/presets/early-backbeat/drill?seed=harbor-spark-21');
  });

  it('asks itself when the early request failed, so the refusal reaches the page', async () => {
    fetchMock.mockResolvedValue(Response.json({ error: { code: 'x' } }, { status: 400 }));
    startEarlyDrill('early-backbeat', 'stuck');
    const answer = firstValueFrom(api.drill('early-backbeat', 'stuck'));
    const request = await vi.waitFor(() =>
      http.expectOne('/api/presets/early-backbeat/drill?seed=stuck'),
    );
    request.flush(
      { error: { code: 'search_exhausted', message: 'No drill found.' } },
      { status: 400, statusText: 'Bad Request' },
    );
    await expect(answer).rejects.toMatchObject({ status: 400 });
  });

  it('ignores an early answer for another seed', async () => {
    fetchMock.mockResolvedValue(Response.json({ drill: DRILL }));
    startEarlyDrill('early-backbeat', 'harbor-spark-21');
    const answer = firstValueFrom(api.drill('early-backbeat', 'other'));
    const other = { ...DRILL, seed: 'other' };
    http.expectOne('/api/presets/early-backbeat/drill?seed=other').flush({ drill: other });
    await expect(answer).resolves.toEqual(other);
  });
});
