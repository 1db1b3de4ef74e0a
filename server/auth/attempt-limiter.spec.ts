import { describe, expect, it } from 'vitest';
import { AttemptLimiter } from './attempt-limiter';

function limiterAt(start = 1_000) {
  const clock = { now: start };
  const limiter = new AttemptLimiter({ maxFailures: 3, windowMs: 60_000, now: () => clock.now });
  return { limiter, clock };
}

describe('AttemptLimiter', () => {
  it('allows attempts until the failure limit, then blocks for the rest of the window', () => {
    const { limiter, clock } = limiterAt();
    limiter.recordFailure('k');
    limiter.recordFailure('k');
    expect(limiter.retryAfterMs('k')).toBe(0);
    limiter.recordFailure('k');
    expect(limiter.retryAfterMs('k')).toBe(60_000);
    clock.now += 45_000;
    expect(limiter.retryAfterMs('k')).toBe(15_000);
  });

  it('lets the key try again once the window has passed', () => {
    const { limiter, clock } = limiterAt();
    for (let i = 0; i < 3; i++) limiter.recordFailure('k');
    clock.now += 60_000;
    expect(limiter.retryAfterMs('k')).toBe(0);
    limiter.recordFailure('k');
    expect(limiter.retryAfterMs('k')).toBe(0);
  });

  it('keeps keys apart', () => {
    const { limiter } = limiterAt();
    for (let i = 0; i < 3; i++) limiter.recordFailure('a');
    expect(limiter.retryAfterMs('a')).toBeGreaterThan(0);
    expect(limiter.retryAfterMs('b')).toBe(0);
  });

  it('clears a key on reset', () => {
    const { limiter } = limiterAt();
    for (let i = 0; i < 3; i++) limiter.recordFailure('k');
    limiter.reset('k');
    expect(limiter.retryAfterMs('k')).toBe(0);
  });

  it('sweeps expired keys so memory stays bounded', () => {
    const clock = { now: 0 };
    const limiter = new AttemptLimiter({
      maxFailures: 3,
      windowMs: 10,
      now: () => clock.now,
      sweepAbove: 5,
    });
    for (let i = 0; i < 5; i++) limiter.recordFailure(`old-${i}`);
    clock.now = 100;
    limiter.recordFailure('new');
    expect(limiter.size).toBe(1);
  });
});
