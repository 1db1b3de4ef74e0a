import type { VoiceId } from './drill';

/** Voice names as a teacher says them. */
const VOICE_WORDS: Readonly<Record<VoiceId, string>> = {
  kick: 'kick',
  snare: 'snare',
  rim: 'rim click',
  hihat: 'hi-hat',
  hihatOpen: 'open hi-hat',
  hihatFoot: 'hi-hat foot',
  ride: 'ride',
  rideBell: 'ride bell',
  crash: 'crash',
  tomHigh: 'high tom',
  tomMid: 'mid tom',
  tomFloor: 'floor tom',
};

/** The voice's name in words ("hi-hat" for `hihat`). */
export function voiceWord(voice: string): string {
  return (VOICE_WORDS as Record<string, string>)[voice] ?? voice;
}

/** "2", "2 and 4", "1, 2 and 3" (or "4 or 8" with `joiner` "or"). */
export function listWords(items: readonly (string | number)[], joiner = 'and'): string {
  const words = items.map(String);
  if (words.length <= 1) return words.join('');
  return `${words.slice(0, -1).join(', ')} ${joiner} ${words[words.length - 1]}`;
}

/** "beat 2" or "the 'e' of 2": how a drummer counts a position (sixteenths and eighths only). */
export function positionWords(bar: number, beat: number, slot: number, slots: number): string {
  return `bar ${bar}, ${slotWords(beat, slot, slots)}`;
}

function slotWords(beat: number, slot: number, slots: number): string {
  if (slot === 0) return `beat ${beat}`;
  if (slots === 4) return `the '${['', 'e', '&', 'a'][slot]}' of ${beat}`;
  if (slots === 2) return `the '&' of ${beat}`;
  if (slots === 3) return `the '${['', 'trip', 'let'][slot]}' of ${beat}`;
  return `beat ${beat}, note ${slot + 1} of ${slots}`;
}
