import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';

const CLI = join(import.meta.dirname, 'generate-drill.ts');
const dir = mkdtempSync(join(tmpdir(), 'tensile-cli-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function cardFile(name: string, card: unknown): string {
  const path = join(dir, name);
  writeFileSync(path, typeof card === 'string' ? card : JSON.stringify(card));
  return path;
}

function run(...args: string[]) {
  const result = spawnSync('npx', ['tsx', CLI, ...args], { encoding: 'utf8', timeout: 60_000 });
  return { status: result.status, stdout: result.stdout, stderr: result.stderr };
}

const GOOD = {
  meter: { beats: 4, unit: 4 },
  bars: 2,
  subdivision: 4,
  tempo: 92,
  voices: ['kick', 'snare', 'hihat'],
  ostinato: { voice: 'hihat', slots: [0, 2] },
  density: 0.3,
  rules: [{ kind: 'backbeat', voice: 'snare', beats: [2, 4], shift: 0 }],
};

// Each case starts one or two `tsx` processes; on a busy 2-core machine that takes seconds each.
describe('npm run generate (generate-drill.ts)', { timeout: 120_000 }, () => {
  it('prints the drill of a good card as JSON, the same for the same seed', () => {
    const path = cardFile('good.json', GOOD);
    const first = run('--card', path, '--seed', 'lesson-12');
    expect(first.status).toBe(0);
    const drill = JSON.parse(first.stdout) as { seed: string; bars: unknown[] };
    expect(drill.seed).toBe('lesson-12');
    expect(drill.bars).toHaveLength(2);
    expect(run('--card', path, '--seed', 'lesson-12').stdout).toBe(first.stdout);
  });

  it('exits non-zero with the readable message on a bad card', () => {
    const bad = run('--card', cardFile('bad.json', { ...GOOD, subdivision: 9 }), '--seed', 's');
    expect(bad.status).not.toBe(0);
    expect(bad.stdout).toBe('');
    expect(bad.stderr).toMatch(/Slots per beat must be between 1 and 8/);
  });

  it('exits non-zero on a file that is not JSON', () => {
    const bad = run('--card', cardFile('broken.json', '{ "meter": '), '--seed', 's');
    expect(bad.status).not.toBe(0);
    expect(bad.stderr).toMatch(/not valid JSON/);
  });

  it('exits non-zero naming the rules when they conflict', () => {
    // A linear card with no overlaps cannot also put a backbeat under the hi-hat's quarter notes.
    const conflict = {
      ...GOOD,
      ostinato: { voice: 'hihat', slots: [0] },
      rules: [
        { kind: 'backbeat', voice: 'snare', beats: [2, 4], shift: 0 },
        { kind: 'linear', maxOverlaps: 0 },
      ],
    };
    const result = run('--card', cardFile('conflict.json', conflict), '--seed', 's');
    expect(result.status).not.toBe(0);
    expect(result.stderr).toMatch(/linear/i);
    expect(result.stderr).toMatch(/backbeat/i);
  });

  it('generates a built-in preset and explains its options with --help', () => {
    const preset = run('--preset', 'four-over-three', '--seed', 'x', '--compact');
    expect(preset.status).toBe(0);
    expect((JSON.parse(preset.stdout) as { bars: { beats: number[] }[] }).bars[0]?.beats).toEqual([
      4, 4, 4,
    ]);
    const help = run('--help');
    expect(help.status).toBe(0);
    expect(help.stdout).toMatch(/--card FILE/);
    expect(run('--preset', 'no-such-card').status).toBe(2);
  });
});
