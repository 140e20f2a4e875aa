/**
 * Counts failed sign-in attempts per key (an account's e-mail, a client address) in a sliding
 * window, and says how long a key must wait once it has used up its allowance.
 * Kept in the web process's memory: one limiter per server process.
 */
export class AttemptLimiter {
  private readonly failures = new Map<string, number[]>();

  /**
   * @param maxFailures failed attempts allowed inside the window
   * @param windowMs length of the sliding window, ms
   * @param now clock, ms (injectable for tests)
   */
  constructor(
    readonly maxFailures: number,
    readonly windowMs: number,
    private readonly now: () => number = Date.now,
  ) {
    if (!(maxFailures >= 1) || !(windowMs > 0)) throw new Error('AttemptLimiter needs at least one allowed failure and a positive window');
  }

  private recent(key: string): number[] {
    const cutoff = this.now() - this.windowMs;
    const kept = (this.failures.get(key) ?? []).filter((t) => t > cutoff);
    if (kept.length) this.failures.set(key, kept);
    else this.failures.delete(key);
    return kept;
  }

  /** Seconds until `key` may try again, or 0 when it may try now. */
  retryAfterSec(key: string): number {
    const recent = this.recent(key);
    if (recent.length < this.maxFailures) return 0;
    const oldestThatCounts = recent[recent.length - this.maxFailures];
    return Math.max(1, Math.ceil((oldestThatCounts + this.windowMs - this.now()) / 1000));
  }

  fail(key: string): void {
    const recent = this.recent(key);
    recent.push(this.now());
    this.failures.set(key, recent);
  }

  clear(key: string): void {
    this.failures.delete(key);
  }
}
