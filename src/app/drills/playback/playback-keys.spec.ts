import { describe, expect, it } from 'vitest';
import { playbackKeyAction, type KeyLike } from './playback-keys';

function key(
  key: string,
  code: string,
  target: EventTarget | null = document.body,
  shiftKey = false,
): KeyLike {
  return { key, code, shiftKey, ctrlKey: false, altKey: false, metaKey: false, target };
}

describe('playback keys', () => {
  it('plays on space, changes tempo on arrows, mutes and solos on digits', () => {
    expect(playbackKeyAction(key(' ', 'Space'))).toEqual({ kind: 'togglePlay' });
    expect(playbackKeyAction(key('ArrowUp', 'ArrowUp'))).toEqual({ kind: 'tempo', by: 1 });
    expect(playbackKeyAction(key('ArrowDown', 'ArrowDown', document.body, true))).toEqual({
      kind: 'tempo',
      by: -5,
    });
    expect(playbackKeyAction(key('3', 'Digit3'))).toEqual({ kind: 'mute', voiceIndex: 2 });
    expect(playbackKeyAction(key('!', 'Digit1', document.body, true))).toEqual({
      kind: 'solo',
      voiceIndex: 0,
    });
  });

  it('leaves keys alone in text fields and on buttons (space presses the button)', () => {
    const field = document.createElement('input');
    field.type = 'number';
    expect(playbackKeyAction(key(' ', 'Space', field))).toBeNull();
    expect(playbackKeyAction(key('1', 'Digit1', field))).toBeNull();
    const button = document.createElement('button');
    expect(playbackKeyAction(key(' ', 'Space', button))).toBeNull();
    expect(playbackKeyAction({ ...key('1', 'Digit1'), ctrlKey: true })).toBeNull();
  });
});
