import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';

import { RuleCards } from './rule-cards';

describe('RuleCards', () => {
  let backend: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [RuleCards],
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([]),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    // The table of the teacher's own cards asks for its first page; card-table.spec covers it.
    backend.match((request) => request.url === '/api/rule-cards');
    backend.verify();
  });

  async function render() {
    const fixture = TestBed.createComponent(RuleCards);
    await fixture.whenStable();
    return fixture;
  }

  it('lists each built-in card with meter, subdivision and summary, linking to a fresh drill', async () => {
    const fixture = await render();
    expect(fixture.nativeElement.querySelector('mat-progress-bar')).not.toBeNull();
    backend.expectOne('/api/presets').flush({
      presets: [
        {
          id: 'backbeat-basics',
          title: 'Backbeat basics',
          summary: 'Snare on 2 and 4, kick stays off beat 1 until bar 3.',
          card: {},
          meter: { beats: 4, unit: 4 },
          subdivision: 4,
        },
        {
          id: 'shuffle-triplets',
          title: 'Triplet shuffle',
          summary: 'Hi-hat on the first and last triplet of every beat.',
          card: {},
          meter: { beats: 12, unit: 8 },
          subdivision: 3,
        },
      ],
    });
    await fixture.whenStable();
    const page = fixture.nativeElement as HTMLElement;
    const cards = [...page.querySelectorAll('mat-card')];
    expect(cards.map((card) => card.querySelector('h3')?.textContent?.trim())).toEqual([
      'Backbeat basics',
      'Triplet shuffle',
    ]);
    expect(cards[0]?.textContent).toContain('4/4');
    expect(cards[0]?.textContent).toContain('sixteenths');
    expect(cards[1]?.textContent).toContain('12/8');
    expect(cards[1]?.textContent).toContain('triplets');
    const links = cards.map((card) => new URL(card.querySelector('a')!.href, 'http://localhost'));
    expect(links[0]?.pathname).toBe('/drills/backbeat-basics');
    expect(links[1]?.pathname).toBe('/drills/shuffle-triplets');
    for (const link of links)
      expect(link.searchParams.get('seed')).toMatch(/^[a-z]+-[a-z]+-\d{2}$/);
  });

  it('says what went wrong when the list cannot load', async () => {
    const fixture = await render();
    backend
      .expectOne('/api/presets')
      .flush(
        { error: { code: 'internal', message: 'The preset store is unavailable.' } },
        { status: 500, statusText: 'Error' },
      );
    await fixture.whenStable();
    expect(fixture.nativeElement.textContent).toContain('The preset store is unavailable.');
  });
});
