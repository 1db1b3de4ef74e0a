import type { LogLevelName } from './config';

/** A small structured logger: one JSON line per entry. */
export interface Logger {
  debug(message: string, fields?: LogFields): void;
  info(message: string, fields?: LogFields): void;
  warn(message: string, fields?: LogFields): void;
  error(message: string, fields?: LogFields): void;
}

export type LogFields = Record<string, unknown>;

const LEVELS: Record<LogLevelName, number> = {
  debug: 10,
  info: 20,
  warn: 30,
  error: 40,
  silent: 99,
};

/** Field names whose values never reach the log, whatever the caller passes. */
const SECRET_FIELD = /pass(word)?|secret|token|cookie|authorization|hash/i;

/** Creates a logger writing entries at `level` or above to `write` (stdout/stderr by default). */
export function createLogger(
  level: LogLevelName = 'info',
  write: (line: string, severity: LogLevelName) => void = writeToConsole,
): Logger {
  const threshold = LEVELS[level];
  const log =
    (severity: Exclude<LogLevelName, 'silent'>) => (message: string, fields?: LogFields) => {
      if (LEVELS[severity] < threshold) return;
      const entry = { time: new Date().toISOString(), level: severity, message, ...redact(fields) };
      write(JSON.stringify(entry), severity);
    };
  return { debug: log('debug'), info: log('info'), warn: log('warn'), error: log('error') };
}

/** Turns an unknown thrown value into loggable fields (name, message, stack). */
export function errorFields(error: unknown): LogFields {
  if (error instanceof Error) {
    return { error: { name: error.name, message: error.message, stack: error.stack } };
  }
  return { error: String(error) };
}

function redact(fields: LogFields | undefined): LogFields {
  if (!fields) return {};
  return Object.fromEntries(
    Object.entries(fields).map(([key, value]) => [
      key,
      SECRET_FIELD.test(key) ? '[redacted]' : value,
    ]),
  );
}

function writeToConsole(line: string, severity: LogLevelName): void {
  (severity === 'error' || severity === 'warn' ? process.stderr : process.stdout).write(
    line + '\n',
  );
}
