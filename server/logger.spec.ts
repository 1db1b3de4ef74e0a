import { describe, expect, it } from 'vitest';
import { createLogger } from './logger';

describe('createLogger', () => {
  it('writes JSON lines at or above its level', () => {
    const lines: string[] = [];
    const logger = createLogger('warn', (line) => lines.push(line));
    logger.info('quiet');
    logger.warn('loud', { count: 2 });
    expect(lines).toHaveLength(1);
    expect(JSON.parse(lines[0]!)).toMatchObject({ level: 'warn', message: 'loud', count: 2 });
  });

  it('never writes the values of secret-looking fields', () => {
    const lines: string[] = [];
    const logger = createLogger('debug', (line) => lines.push(line));
    logger.info('x', {
      password: 'p1',
      sessionSecret: 's1',
      cookie: 'c1',
      passwordHash: 'h1',
      email: 'e',
    });
    expect(lines[0]).not.toMatch(/p1|s1|c1|h1/);
    expect(JSON.parse(lines[0]!)).toMatchObject({ email: 'e', password: '[redacted]' });
  });

  it('writes nothing when silent', () => {
    const lines: string[] = [];
    createLogger('silent', (line) => lines.push(line)).error('x');
    expect(lines).toHaveLength(0);
  });
});
