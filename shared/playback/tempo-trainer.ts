/**
 * The tempo trainer: start at one tempo, raise (or lower) it by a step every few loops, and hold
 * the target once it is reached. The last step lands exactly on the target even when the step
 * does not divide the distance.
 */

export const MIN_TEMPO = 20;
export const MAX_TEMPO = 320;

export interface TempoTrainer {
  readonly startTempo: number;
  /** Beats per minute added per step (the sign follows the direction to the target). */
  readonly stepBpm: number;
  /** Loops played at each tempo before the next step. */
  readonly everyLoops: number;
  readonly targetTempo: number;
}

/** Where the trainer stands during one loop. */
export interface TrainerStep {
  /** 1-based step, as shown: "Step 3 of 6". */
  readonly step: number;
  readonly steps: number;
  readonly tempo: number;
}

/** A whole tempo inside the playable range. */
export function clampTempo(tempo: number): number {
  if (!Number.isFinite(tempo)) return MIN_TEMPO;
  return Math.min(MAX_TEMPO, Math.max(MIN_TEMPO, Math.round(tempo)));
}

/** Checks the settings and brings both tempos inside the playable range. */
export function normaliseTrainer(trainer: TempoTrainer): TempoTrainer {
  const { stepBpm, everyLoops } = trainer;
  if (!Number.isInteger(stepBpm) || stepBpm < 1) {
    throw new RangeError('The tempo step must be a whole number of at least 1 BPM.');
  }
  if (!Number.isInteger(everyLoops) || everyLoops < 1) {
    throw new RangeError('Step up after at least 1 loop.');
  }
  return {
    startTempo: clampTempo(trainer.startTempo),
    targetTempo: clampTempo(trainer.targetTempo),
    stepBpm,
    everyLoops,
  };
}

/** How many tempos the trainer plays, the start and the target included. */
export function trainerSteps(trainer: TempoTrainer): number {
  const t = normaliseTrainer(trainer);
  return Math.ceil(Math.abs(t.targetTempo - t.startTempo) / t.stepBpm) + 1;
}

/** The tempo of a 0-based step index. */
export function trainerTempoAtStep(trainer: TempoTrainer, stepIndex: number): number {
  const t = normaliseTrainer(trainer);
  const direction = Math.sign(t.targetTempo - t.startTempo);
  const tempo = t.startTempo + direction * stepIndex * t.stepBpm;
  return direction >= 0 ? Math.min(tempo, t.targetTempo) : Math.max(tempo, t.targetTempo);
}

/** Step and tempo for 0-based loop `loop`; the trainer holds its target after the last step. */
export function trainerStepForLoop(trainer: TempoTrainer, loop: number): TrainerStep {
  if (!Number.isInteger(loop) || loop < 0) throw new RangeError('Loops count from 0.');
  const t = normaliseTrainer(trainer);
  const steps = trainerSteps(t);
  const index = Math.min(Math.floor(loop / t.everyLoops), steps - 1);
  return { step: index + 1, steps, tempo: trainerTempoAtStep(t, index) };
}

function gcdBig(a: bigint, b: bigint): bigint {
  let x = a < 0n ? -a : a;
  let y = b < 0n ? -b : b;
  while (y !== 0n) [x, y] = [y, x % y];
  return x;
}

/** The nearest double to the non-negative fraction `num / den`, for arbitrarily large parts. */
export function bigFractionToNumber(num: bigint, den: bigint): number {
  const limit = 1n << 53n;
  if (num < limit && den < limit) return Number(num) / Number(den);
  // Keep at least 66 quotient bits plus a sticky bit, so Number() rounds once, correctly.
  const shift = Math.max(0, 66 - (num.toString(2).length - den.toString(2).length));
  const scaled = num << BigInt(shift);
  let quotient = scaled / den;
  if (scaled % den !== 0n) quotient |= 1n;
  return Number(quotient) / 2 ** shift;
}

/**
 * Seconds from playback start to the first beat of loop `loop` when the trainer runs: the
 * count-in at the start tempo, then `loopBeats × 60 / tempo` for every loop before. Summed as an
 * exact fraction and rounded once.
 */
export function trainerLoopStartSeconds(
  trainer: TempoTrainer,
  loopBeats: number,
  countInBeats: number,
  loop: number,
): number {
  const t = normaliseTrainer(trainer);
  let num = BigInt(countInBeats * 60);
  let den = BigInt(t.startTempo);
  const steps = trainerSteps(t);
  let remaining = loop;
  for (let index = 0; index < steps && remaining > 0; index += 1) {
    const loopsHere = index === steps - 1 ? remaining : Math.min(t.everyLoops, remaining);
    remaining -= loopsHere;
    const tempo = BigInt(trainerTempoAtStep(t, index));
    num = num * tempo + BigInt(loopsHere * loopBeats * 60) * den;
    den *= tempo;
    const divisor = gcdBig(num, den) || 1n;
    num /= divisor;
    den /= divisor;
  }
  return bigFractionToNumber(num, den);
}
