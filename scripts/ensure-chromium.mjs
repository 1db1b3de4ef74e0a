#!/usr/bin/env node
// Makes sure Debian's Chromium is present for the browser journeys. Browser tests drive the
// system browser through playwright-core; a test tool's own browser download would need the
// open internet, which this project never relies on.
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';

const CHROMIUM = '/usr/bin/chromium';
const PACKAGES = ['chromium'];

function printVersion() {
  const out = execFileSync(CHROMIUM, ['--version'], { encoding: 'utf8' }).trim();
  console.log(`ensure-chromium: ${out} at ${CHROMIUM}`);
}

function run(command, args) {
  console.log(`ensure-chromium: ${command} ${args.join(' ')}`);
  const result = spawnSync(command, args, {
    stdio: 'inherit',
    env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
  });
  if (result.status !== 0) {
    console.error(
      `ensure-chromium: "${command} ${args.join(' ')}" failed (exit ${result.status}).`,
    );
    process.exit(1);
  }
}

if (!existsSync(CHROMIUM)) {
  const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
  if (!isRoot) {
    console.error(
      `ensure-chromium: ${CHROMIUM} is missing. Install Debian's Chromium, then run the tests again:\n` +
        `  sudo apt-get update && sudo apt-get install -y ${PACKAGES.join(' ')}`,
    );
    process.exit(1);
  }
  run('apt-get', ['update']);
  // Recommends bring fonts-liberation; fontconfig brings DejaVu, so text renders without extras.
  run('apt-get', ['install', '-y', ...PACKAGES]);
  if (!existsSync(CHROMIUM)) {
    console.error(
      `ensure-chromium: installed ${PACKAGES.join(' ')} but ${CHROMIUM} is still missing.`,
    );
    process.exit(1);
  }
}

printVersion();
