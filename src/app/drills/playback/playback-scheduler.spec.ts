import { describe, expect, it } from 'vitest';
import type { DrillBar } from '../../../../shared/generator/drill';
import { PlaybackScheduler, type LiveMix, type PlaybackSink } from './playback-scheduler';

const bar = (n: number): DrillBar => ({
  bar: n,
  beats: [4, 4],
  tension: 0,
  hits: [
    { beat: 1, slot: 0, voice: 'kick', dynamic: 'normal', hand: null, source: 'fill' },
    { beat: 2, slot: 2, voice: 'snare', dynamic: 'ghost', hand: 'L', source: 'fill' },
  ],
});
const drill = { bars: [bar(1), bar(2)] };
const mix: LiveMix = {
  mute: new Set(),
  solo: new Set(),
  metronome: { enabled: true, accentFirstBeat: true, subdivisions: false },
};

function recorder() {
  const log: string[] = [];
  const sink: PlaybackSink = {
    hit: (voice, time) => log.push(`${voice}@${time.toFixed(4)}`),
    click: (sound, time) => log.push(`${sound}@${time.toFixed(4)}`),
  };
  return { log, sink };
}

describe('PlaybackScheduler', () => {
  const settings = { tempo: 120, range: null, countIn: true, playOnce: false, trainer: null };

  it('hands over only what is due before the horizon, in order, on the audio clock', () => {
    const { log, sink } = recorder();
    const scheduler = new PlaybackScheduler(drill, settings, 10, sink, () => mix);
    scheduler.pump(11.01);
    // Count-in of 2 beats at 120 BPM (0.5 s each), then bar 1 from 11 s.
    expect(log).toEqual(['accent@10.0000', 'beat@10.5000', 'accent@11.0000', 'kick@11.0000']);
    scheduler.pump(12.01);
    expect(log.slice(4)).toEqual([
      'beat@11.5000',
      'snare@11.7500',
      'accent@12.0000',
      'kick@12.0000',
    ]);
  });

  it('reads mute and metronome settings at hand-over time', () => {
    const { log, sink } = recorder();
    let live = mix;
    const scheduler = new PlaybackScheduler(drill, settings, 0, sink, () => live);
    scheduler.pump(1.01);
    live = { ...mix, mute: new Set(['kick']), metronome: { ...mix.metronome, enabled: false } };
    scheduler.pump(3);
    expect(log.slice(4)).toEqual(['snare@1.7500', 'snare@2.7500']);
  });

  it('changes tempo at the horizon and keeps the bar position', () => {
    const { sink } = recorder();
    const scheduler = new PlaybackScheduler(drill, settings, 0, sink, () => mix);
    scheduler.pump(1.2);
    scheduler.setTempo(60);
    expect(scheduler.positionAt(1.2)).toEqual({ phase: 'drill', loop: 0, bar: 1, beat: 1 });
    // 2.4 beats at 1.2 s; beat 2 of bar 1 (beat 3 from start) comes 0.6 beats later at 60 BPM.
    const sent = scheduler.pump(10);
    expect(
      sent.find((d) => d.event.kind === 'click' && d.event.bar === 1 && d.event.beat === 2)?.time,
    ).toBeCloseTo(1.8, 9);
  });

  it('follows the tempo trainer loop by loop and reports its step', () => {
    const { sink } = recorder();
    const trainer = { startTempo: 60, stepBpm: 60, everyLoops: 1, targetTempo: 120 };
    const scheduler = new PlaybackScheduler(drill, { ...settings, trainer }, 0, sink, () => mix);
    const sent = scheduler.pump(20);
    // Count-in 2 s, loop 0 (4 beats) at 60 BPM = 4 s, loop 1 at 120 BPM from 6 s.
    const downbeats = sent
      .filter((d) => d.event.kind === 'hit' && d.event.voice === 'kick')
      .map((d) => d.time);
    expect(downbeats.slice(0, 4)).toEqual([2, 4, 6, 7]);
    expect(scheduler.trainerStepAt(6.5)).toEqual({ step: 2, steps: 2, tempo: 120 });
  });

  it('ends after one pass when playing once', () => {
    const { log, sink } = recorder();
    const scheduler = new PlaybackScheduler(
      drill,
      { ...settings, playOnce: true, countIn: false },
      0,
      sink,
      () => mix,
    );
    scheduler.pump(100);
    expect(scheduler.endTime).toBe(2);
    expect(log.filter((l) => l.startsWith('kick'))).toHaveLength(2);
    expect(scheduler.positionAt(2.5)).toBeNull();
  });

  it('starts the first pass at a picked beat, after a full count-in, then loops whole', () => {
    const { sink } = recorder();
    const startAt = { bar: 2, beat: 2 };
    const scheduler = new PlaybackScheduler(drill, { ...settings, startAt }, 0, sink, () => mix);
    const sent = scheduler.pump(4.01);
    // Count-in: 2 beats at 0.5 s. Bar 2 beat 2 is heard at 1 s; loop 1 (bar 1) starts at 1.5 s.
    expect(sent.map((d) => `${d.event.bar}.${d.event.beat}.${d.event.slot}@${d.time}`)).toEqual([
      '0.1.0@0',
      '0.2.0@0.5',
      '2.2.0@1',
      '2.2.2@1.25',
      '1.1.0@1.5',
      '1.1.0@1.5',
      '1.2.0@2',
      '1.2.2@2.25',
      '2.1.0@2.5',
      '2.1.0@2.5',
      '2.2.0@3',
      '2.2.2@3.25',
      '1.1.0@3.5',
      '1.1.0@3.5',
      '1.2.0@4',
    ]);
    expect(scheduler.positionAt(0.6)).toEqual({ phase: 'countIn', beat: 2 });
    expect(scheduler.positionAt(1.1)).toEqual({ phase: 'drill', loop: 0, bar: 2, beat: 2 });
    expect(scheduler.positionAt(1.6)).toEqual({ phase: 'drill', loop: 1, bar: 1, beat: 1 });
  });

  it('starts at the picked beat without a count-in, and at the top when it lies outside the loop', () => {
    const { sink } = recorder();
    const picked = new PlaybackScheduler(
      drill,
      { ...settings, countIn: false, startAt: { bar: 1, beat: 2 } },
      5,
      sink,
      () => mix,
    );
    const first = picked.pump(5.01)[0];
    expect(first?.event.bar).toBe(1);
    expect(first?.event.beat).toBe(2);
    expect(first?.time).toBe(5);
    const outside = new PlaybackScheduler(
      drill,
      { ...settings, range: { from: 1, to: 1 }, startAt: { bar: 2, beat: 1 } },
      0,
      sink,
      () => mix,
    );
    expect(outside.skippedBeats).toBe(0);
  });

  it('keeps the trainer on its loops when the first pass starts at a picked beat', () => {
    const { sink } = recorder();
    const trainer = { startTempo: 60, stepBpm: 60, everyLoops: 1, targetTempo: 120 };
    const scheduler = new PlaybackScheduler(
      drill,
      { ...settings, trainer, startAt: { bar: 2, beat: 1 } },
      0,
      sink,
      () => mix,
    );
    const kicks = scheduler
      .pump(20)
      .filter((d) => d.event.kind === 'hit' && d.event.voice === 'kick')
      .map((d) => d.time);
    // Count-in 2 s, then bar 2 alone at 60 BPM (2 s); loop 1 at 120 BPM from 4 s.
    expect(kicks.slice(0, 3)).toEqual([2, 4, 5]);
    expect(scheduler.trainerStepAt(4.5)).toEqual({ step: 2, steps: 2, tempo: 120 });
  });
});
