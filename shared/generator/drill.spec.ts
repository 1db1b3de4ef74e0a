import { describe, expect, it } from 'vitest';
import { FOOT_VOICES, isHandVoice, VOICE_IDS } from './drill';

describe('isHandVoice', () => {
  it('is false exactly for the feet (it compares names instead of reading FOOT_VOICES)', () => {
    for (const voice of VOICE_IDS) expect(isHandVoice(voice)).toBe(!FOOT_VOICES.has(voice));
  });
});
