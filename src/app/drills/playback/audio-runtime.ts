/**
 * Everything that only playing needs, in one module the playback engine imports on first use
 * (Play, or a pointer over the panel): Tone.js, the synthesised kit and the look-ahead
 * scheduler. The score's path never loads it.
 */
import * as Tone from 'tone';

export { Tone };
export { DrumKit } from './drum-kit';
export { PlaybackScheduler } from './playback-scheduler';
