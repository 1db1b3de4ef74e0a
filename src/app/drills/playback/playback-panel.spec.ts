import { TestBed } from '@angular/core/testing';
import { describe, expect, it } from 'vitest';
import { generateDrill, parseRuleCard } from '../../../../shared/generator/index';
import { PlaybackPanel } from './playback-panel';

const drill = generateDrill(
  parseRuleCard({
    meter: { beats: 4, unit: 4 },
    bars: 2,
    subdivision: 4,
    tempo: 92,
    voices: ['kick', 'snare', 'hihat'],
  }),
  'panel-1',
);

async function render() {
  const fixture = TestBed.createComponent(PlaybackPanel);
  fixture.componentRef.setInput('drill', drill);
  await fixture.whenStable();
  return { fixture, root: fixture.nativeElement as HTMLElement };
}

describe('PlaybackPanel', () => {
  it("labels every control and lists the drill's voices with mute and solo", async () => {
    const { root } = await render();
    expect(root.querySelector('button.play')?.textContent).toContain('Play');
    const tempo = root.querySelector<HTMLInputElement>('input[type=number]');
    expect(tempo?.value).toBe('92');
    const mutes = [...root.querySelectorAll('button[aria-label^="Mute "]')].map((b) =>
      b.getAttribute('aria-label'),
    );
    expect(mutes).toEqual(['Mute Kick', 'Mute Snare', 'Mute Hi-hat']);
    expect(root.textContent).toContain('take breaks');
  });

  it('toggles mute with number keys and shows it in words, not colour alone', async () => {
    const { fixture, root } = await render();
    document.body.dispatchEvent(
      new KeyboardEvent('keydown', { key: '2', code: 'Digit2', bubbles: true }),
    );
    await fixture.whenStable();
    const snare = root.querySelector('button[aria-label="Mute Snare"]');
    expect(snare?.getAttribute('aria-pressed')).toBe('true');
    expect(snare?.textContent).toContain('Muted');
    expect(root.querySelector('button[aria-label="Mute Kick"]')?.getAttribute('aria-pressed')).toBe(
      'false',
    );
  });

  it('nudges the tempo with the arrow keys, by 5 with Shift, inside 20–320', async () => {
    const { fixture, root } = await render();
    document.body.dispatchEvent(
      new KeyboardEvent('keydown', { key: 'ArrowUp', code: 'ArrowUp', bubbles: true }),
    );
    document.body.dispatchEvent(
      new KeyboardEvent('keydown', {
        key: 'ArrowUp',
        code: 'ArrowUp',
        shiftKey: true,
        bubbles: true,
      }),
    );
    await fixture.whenStable();
    expect(root.querySelector<HTMLInputElement>('input[type=number]')?.value).toBe('98');
  });

  it('steps the tempo slider by 1 with the arrows and by 5 with Shift+arrows, inside 20–320', async () => {
    const { fixture, root } = await render();
    const thumb = root.querySelector<HTMLInputElement>('input[matSliderThumb], input[type=range]')!;
    const field = () => root.querySelector<HTMLInputElement>('input[type=number]')!.value;
    const press = (key: string, shiftKey = false) => {
      const event = new KeyboardEvent('keydown', {
        key,
        code: key,
        shiftKey,
        bubbles: true,
        cancelable: true,
      });
      thumb.dispatchEvent(event);
      return event;
    };
    const shifted = press('ArrowRight', true);
    expect(shifted.defaultPrevented).toBe(true); // the native one-step move is replaced
    await fixture.whenStable();
    expect(field()).toBe('97');
    press('ArrowUp', true);
    press('ArrowLeft');
    await fixture.whenStable();
    expect(field()).toBe('101');
    expect(thumb.value).toBe('101');
    press('ArrowDown', true);
    press('ArrowDown');
    await fixture.whenStable();
    expect(field()).toBe('95');
    for (let i = 0; i < 60; i++) press('ArrowUp', true);
    await fixture.whenStable();
    expect(field()).toBe('320');
    for (let i = 0; i < 70; i++) press('ArrowLeft', true);
    await fixture.whenStable();
    expect(field()).toBe('20');
    // Page keys stay with the slider itself.
    expect(press('PageUp').defaultPrevented).toBe(false);
  });
});
