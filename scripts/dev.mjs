#!/usr/bin/env node
// Development: runs the API (`npm run dev:server`, port 8080) and `ng serve` (proxying /api to it)
// side by side. Ctrl+C, SIGTERM or either child exiting stops both, each with its whole process
// group, so no orphaned watcher keeps a port busy.
import { spawn } from 'node:child_process';
import process from 'node:process';

const isWindows = process.platform === 'win32';
const npm = isWindows ? 'npm.cmd' : 'npm';
const ngArgs = process.argv.slice(2);

/** @type {{ name: string, child: import('node:child_process').ChildProcess }[]} */
const children = [];
let stopping = false;

function start(name, command, args) {
  // detached: each child leads its own process group, so we can signal the group (tsx watch and
  // the Angular dev server both start grandchildren).
  const child = spawn(command, args, { stdio: ['ignore', 'pipe', 'pipe'], detached: !isWindows });
  const prefix = `[${name}] `;
  for (const [source, sink] of [
    [child.stdout, process.stdout],
    [child.stderr, process.stderr],
  ]) {
    let pending = '';
    source.setEncoding('utf8');
    source.on('data', (chunk) => {
      const lines = (pending + chunk).split('\n');
      pending = lines.pop() ?? '';
      for (const line of lines) sink.write(prefix + line + '\n');
    });
    source.on('end', () => pending && sink.write(prefix + pending + '\n'));
  }
  child.on('exit', (code, signal) => {
    if (!stopping) {
      console.error(`${prefix}exited (${signal ?? code}); stopping the others.`);
      stop(code ?? 1);
    }
  });
  children.push({ name, child });
}

function signalGroup(child, signal) {
  if (child.exitCode !== null || child.signalCode !== null || child.pid === undefined) return;
  try {
    if (isWindows) child.kill(signal);
    else process.kill(-child.pid, signal);
  } catch {
    // already gone
  }
}

function stop(exitCode = 0) {
  if (stopping) return;
  stopping = true;
  for (const { child } of children) signalGroup(child, 'SIGTERM');
  // Give watchers a moment to close their ports, then make sure.
  const deadline = setTimeout(() => {
    for (const { child } of children) signalGroup(child, 'SIGKILL');
    process.exit(exitCode);
  }, 5000);
  deadline.unref();
  Promise.all(
    children.map(
      ({ child }) =>
        new Promise((resolve) =>
          child.exitCode !== null || child.signalCode !== null
            ? resolve()
            : child.once('exit', resolve),
        ),
    ),
  ).then(() => process.exit(exitCode));
}

process.on('SIGINT', () => stop(0));
process.on('SIGTERM', () => stop(0));
process.on('SIGHUP', () => stop(0));

start('api', npm, ['run', 'dev:server']);
start('web', npm, ['exec', '--', 'ng', 'serve', ...ngArgs]);
