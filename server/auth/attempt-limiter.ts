/** Settings for an {@link AttemptLimiter}. */
export interface AttemptLimiterOptions {
  /** Failed attempts allowed per key within one window. */
  readonly maxFailures: number;
  /** Length of the window in milliseconds, counted from the key's first failure. */
  readonly windowMs: number;
  /** Clock in milliseconds; replaceable in tests. */
  readonly now?: () => number;
  /** Keys tracked before expired entries are swept, bounding memory. */
  readonly sweepAbove?: number;
}

interface Entry {
  failures: number;
  windowStart: number;
}

/**
 * Counts failed attempts per key (e.g. client address + e-mail) in a fixed window, in memory.
 * Enough for one server process; a success clears the key.
 */
export class AttemptLimiter {
  private readonly entries = new Map<string, Entry>();
  private readonly now: () => number;
  private readonly sweepAbove: number;

  constructor(private readonly options: AttemptLimiterOptions) {
    this.now = options.now ?? Date.now;
    this.sweepAbove = options.sweepAbove ?? 10_000;
  }

  /** Milliseconds until `key` may try again, or 0 when it may try now. */
  retryAfterMs(key: string): number {
    const entry = this.current(key);
    if (!entry || entry.failures < this.options.maxFailures) return 0;
    return entry.windowStart + this.options.windowMs - this.now();
  }

  /** Records one failed attempt for `key`. */
  recordFailure(key: string): void {
    const entry = this.current(key);
    if (entry) {
      entry.failures += 1;
      return;
    }
    if (this.entries.size >= this.sweepAbove) this.sweep();
    this.entries.set(key, { failures: 1, windowStart: this.now() });
  }

  /** Forgets `key`'s failures (after a successful attempt). */
  reset(key: string): void {
    this.entries.delete(key);
  }

  /** Number of keys currently tracked. */
  get size(): number {
    return this.entries.size;
  }

  private current(key: string): Entry | undefined {
    const entry = this.entries.get(key);
    if (entry && this.expired(entry)) {
      this.entries.delete(key);
      return undefined;
    }
    return entry;
  }

  private expired(entry: Entry): boolean {
    return this.now() >= entry.windowStart + this.options.windowMs;
  }

  private sweep(): void {
    for (const [key, entry] of this.entries) {
      if (this.expired(entry)) this.entries.delete(key);
    }
  }
}
