import { describe, expect, it } from 'vitest';
import { retryAfterSec } from '@/lib/auth/attemptLimiter';

// The sliding-window rule of the sign-in limits (OWASP Authentication Cheat Sheet, "account lockout" [common practice]).
describe('retryAfterSec (failed sign-ins, reports sent)', () => {
  const allowance = { max: 3, windowMs: 60_000 };

  it('lets a key fail up to its allowance, then makes it wait until the oldest failure leaves the window', () => {
    const failures = [1_000_000, 1_010_000, 1_020_000];
    expect(retryAfterSec(failures.slice(0, 2), allowance, 1_030_000)).toBe(0);
    // Failures at 0 s, 10 s, 20 s; now 30 s: the first one expires at 60 s.
    expect(retryAfterSec(failures, allowance, 1_030_000)).toBe(30);
    expect(retryAfterSec(failures, allowance, 1_059_000)).toBe(1);
    expect(retryAfterSec(failures, allowance, 1_060_001)).toBe(0);
  });

  it('counts only the newest failures that fill the allowance, in any order', () => {
    const failures = [1_050_000, 1_000_000, 1_040_000, 1_030_000];
    // The three newest (30 s, 40 s, 50 s) count; now 55 s: the one at 30 s expires at 90 s.
    expect(retryAfterSec(failures, allowance, 1_055_000)).toBe(35);
  });

  it('refuses an impossible configuration', () => {
    expect(() => retryAfterSec([], { max: 0, windowMs: 1000 }, 0)).toThrow(/at least one/);
    expect(() => retryAfterSec([], { max: 3, windowMs: 0 }, 0)).toThrow(/positive window/);
  });
});
