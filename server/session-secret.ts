import { randomBytes } from 'node:crypto';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';

/** Name of the file, inside the data directory, that keeps the generated session secret. */
export const SESSION_SECRET_FILE = 'session-secret';

/** Shortest secret accepted from a file or the environment (characters). */
export const MIN_SESSION_SECRET_LENGTH = 32;

/**
 * Returns the session secret kept in `dataDir`, creating it on first start.
 *
 * A fresh random secret per installation means no two installations share one and nothing
 * secret lives in the source; keeping it on disk keeps sign-ins valid across restarts.
 */
export function readOrCreateSessionSecret(dataDir: string): string {
  const file = path.join(dataDir, SESSION_SECRET_FILE);
  const existing = readSecretFile(file);
  if (existing !== undefined) {
    if (existing.length < MIN_SESSION_SECRET_LENGTH) {
      throw new Error(
        `The session secret in ${file} is shorter than ${MIN_SESSION_SECRET_LENGTH} characters; ` +
          'delete the file to have a new one generated.',
      );
    }
    return existing;
  }
  mkdirSync(dataDir, { recursive: true });
  const secret = randomBytes(48).toString('base64url');
  try {
    // 'wx' fails if another process created the file meanwhile; then that one wins.
    writeFileSync(file, secret + '\n', { encoding: 'utf8', mode: 0o600, flag: 'wx' });
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'EEXIST')
      return readOrCreateSessionSecret(dataDir);
    throw error;
  }
  return secret;
}

function readSecretFile(file: string): string | undefined {
  try {
    return readFileSync(file, 'utf8').trim();
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return undefined;
    throw error;
  }
}
