import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { beforeEach, describe, expect, it } from 'vitest';
import { blankCard } from './card-draft';
import { CardEditorStore } from './card-editor-store';
import { PROBLEM_DELAY_MS } from './preview-timing';
import { VoiceSetup, parseNumberList } from './voice-setup';

describe('parseNumberList', () => {
  it('reads groups joined by +, commas or spaces, and refuses anything else', () => {
    expect(parseNumberList('2+2+3')).toEqual([2, 2, 3]);
    expect(parseNumberList(' 2, 4 ')).toEqual([2, 4]);
    expect(parseNumberList('3 3')).toEqual([3, 3]);
    expect(parseNumberList('2+x')).toBeNull();
    expect(parseNumberList('1.5')).toBeNull();
  });
});

describe('VoiceSetup', () => {
  let fixture: ComponentFixture<VoiceSetup>;
  let store: CardEditorStore;
  let page: HTMLElement;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [VoiceSetup],
      providers: [provideZonelessChangeDetection(), CardEditorStore],
    });
    store = TestBed.inject(CardEditorStore);
    store.seed.set('amber-101');
    store.load({ ...blankCard(), meter: { beats: 7, unit: 8 }, subdivision: 2 });
    fixture = TestBed.createComponent(VoiceSetup);
    page = fixture.nativeElement as HTMLElement;
    await fixture.whenStable();
  }, 30_000);

  /** Lets the preview run and its messages show (jsdom has no workers: the engine runs in place). */
  async function settle(): Promise<void> {
    TestBed.tick();
    await new Promise((resolve) => setTimeout(resolve, PROBLEM_DELAY_MS + 200));
    TestBed.tick();
    await fixture.whenStable();
  }

  function field(label: string): HTMLInputElement {
    const found = [...page.querySelectorAll('mat-form-field')].find(
      (f) => f.querySelector('mat-label')?.textContent?.trim() === label,
    );
    if (!found) throw new Error(`No field labelled ${label}`);
    return found.querySelector('input') as HTMLInputElement;
  }

  function change(input: HTMLInputElement, value: string): void {
    input.value = value;
    input.dispatchEvent(new Event('change'));
  }

  it('sets the beat grouping, says when the groups do not add up, and clears it', async () => {
    // 7/8 groups as 2+2+3 unless the card says otherwise (common practice).
    expect(page.textContent).toContain('the usual grouping (2+2+3)');
    change(field('Beat grouping'), '3+2+2');
    expect(store.card().meter?.grouping).toEqual([3, 2, 2]);

    change(field('Beat grouping'), '3+3');
    await settle();
    // The engine's message at the field's path, which the template shows beside the field.
    expect(store.issues('meter.grouping')).toContain(
      'The grouping 3+3 adds up to 6 beats, but the meter has 7.',
    );

    change(field('Beat grouping'), '3+two');
    await fixture.whenStable();
    const local = fixture.componentInstance as unknown as { localProblem(p: string): string };
    expect(local.localProblem('meter.grouping')).toBe(
      'Write the groups as whole numbers joined by +, e.g. 2+2+3.',
    );
    expect(store.card().meter?.grouping).toEqual([3, 3]);

    change(field('Beat grouping'), '');
    expect(store.card().meter?.grouping).toBeUndefined();
  });

  it('gives a voice a role and back to its default', async () => {
    store.edit((card) => (card.roles = { snare: 'time' }));
    await fixture.whenStable();
    expect(page.textContent).toContain('Snare role');
    // Back to the default removes the roles object altogether.
    (fixture.componentInstance as unknown as { setRole: (v: string, r: null) => void }).setRole(
      'snare',
      null,
    );
    expect(store.card().roles).toBeUndefined();
  });

  it("keeps a voice's fills on every 2nd slot and back to any slot", async () => {
    await fixture.whenStable();
    expect(page.textContent).toContain('Kick fills');
    const setup = fixture.componentInstance as unknown as {
      setFillStep: (v: string, s: number) => void;
    };
    setup.setFillStep('kick', 2);
    expect(store.card().fillStep).toEqual({ kick: 2 });
    await fixture.whenStable();
    const kick = [...page.querySelectorAll('mat-form-field')].find((f) =>
      f.querySelector('mat-label')?.textContent?.includes('Kick fills'),
    );
    expect(kick?.querySelector('.mat-mdc-select-value')?.textContent?.trim()).toBe(
      'Every 2nd slot',
    );
    // Any slot removes the field altogether.
    setup.setFillStep('kick', 1);
    expect(store.card().fillStep).toBeUndefined();
  });

  it('names the role the engine would give each voice left to its default', async () => {
    store.edit((card) => {
      card.voices = ['kick', 'snare', 'hihat', 'crash'];
      card.ostinato = { voice: 'hihat', slots: [0] };
    });
    await fixture.whenStable();
    const defaults = () =>
      Object.fromEntries(
        [...page.querySelectorAll('mat-form-field')]
          .filter((f) => f.querySelector('mat-label')?.textContent?.includes(' role'))
          .map((f) => [
            f.querySelector('mat-label')!.textContent!.trim(),
            f.querySelector('.mat-mdc-select-value')!.textContent!.trim(),
          ]),
      );
    // The contract's defaults: the ostinato's voice and every layer's keep time, the kick
    // anchors, the crash colours, the rest embellish.
    expect(defaults()).toEqual({
      'Kick role': 'Default (anchor)',
      'Snare role': 'Default (embellishment)',
      'Hi-hat role': 'Default (time)',
      'Crash role': 'Default (colour)',
    });
    // A layer on the snare makes it keep time; a role of its own replaces the default.
    store.edit((card) => (card.layers = [{ voice: 'snare', slots: [0], beats: [2, 4] }]));
    store.edit((card) => (card.roles = { kick: 'embellishment' }));
    await fixture.whenStable();
    expect(defaults()['Snare role']).toBe('Default (time)');
    expect(defaults()['Kick role']).toBe('Embellishment');
  });

  it('adds, edits and removes a time-keeping layer, with the engine’s words beside its fields', async () => {
    store.edit((card) => (card.voices = ['kick', 'snare', 'hihat', 'hihatFoot']));
    await fixture.whenStable();
    const add = [...page.querySelectorAll('button')].find((b) =>
      b.textContent?.includes('Add a layer'),
    )!;
    add.click();
    await fixture.whenStable();
    expect(store.card().layers).toEqual([
      { voice: 'hihatFoot', slots: [0], beats: [2, 4], dynamic: 'normal' },
    ]);

    change(field('Layer 1 beats'), '2, 9');
    await settle();
    expect(store.card().layers?.[0]?.beats).toEqual([2, 9]);
    expect(store.issues('layers[0].beats')).toContain(
      'Layer 1 names beat 9, but a bar has only 7 beats.',
    );

    change(field('Layer 1 beats'), '');
    expect(store.card().layers?.[0]?.beats).toBeUndefined();

    page.querySelector<HTMLButtonElement>('button[aria-label="Remove layer 1"]')!.click();
    expect(store.card().layers).toBeUndefined();
  });
});
