import { describe, expect, it } from 'vitest';
import { AttemptLimiter } from '@/lib/auth/attemptLimiter';

function clock(start = 1_000_000) {
  let t = start;
  return { now: () => t, advance: (ms: number) => (t += ms) };
}

describe('AttemptLimiter (failed sign-ins)', () => {
  it('lets a key fail up to its allowance, then makes it wait until the oldest failure leaves the window', () => {
    const c = clock();
    const limiter = new AttemptLimiter(3, 60_000, c.now);
    for (let i = 0; i < 3; i++) {
      expect(limiter.retryAfterSec('ines@demo.test')).toBe(0);
      limiter.fail('ines@demo.test');
      c.advance(10_000);
    }
    // Failures at 0 s, 10 s, 20 s; now 30 s: the first one expires at 60 s.
    expect(limiter.retryAfterSec('ines@demo.test')).toBe(30);
    c.advance(29_000);
    expect(limiter.retryAfterSec('ines@demo.test')).toBe(1);
    c.advance(1_001);
    expect(limiter.retryAfterSec('ines@demo.test')).toBe(0);
  });

  it('keeps keys apart and forgets a key on success', () => {
    const c = clock();
    const limiter = new AttemptLimiter(2, 60_000, c.now);
    limiter.fail('a');
    limiter.fail('a');
    expect(limiter.retryAfterSec('a')).toBeGreaterThan(0);
    expect(limiter.retryAfterSec('b')).toBe(0);
    limiter.clear('a');
    expect(limiter.retryAfterSec('a')).toBe(0);
  });

  it('refuses an impossible configuration', () => {
    expect(() => new AttemptLimiter(0, 1000)).toThrow(/at least one/);
    expect(() => new AttemptLimiter(3, 0)).toThrow(/positive window/);
  });
});
