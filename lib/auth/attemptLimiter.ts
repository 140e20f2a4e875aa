/**
 * The sliding-window rule behind Takeproof's limits (failed sign-ins, reports sent): a key (an
 * account at one address, an address, a person, a studio) may act `max` times in any `windowMs`;
 * after that it waits until its oldest event that counts leaves the window. The events themselves
 * live in the database, so every web instance applies the same counts.
 */
export interface Allowance {
  max: number;
  windowMs: number;
}

/** Seconds until a key with events at `times` (ms) may act again, or 0 when it may act now. */
export function retryAfterSec(times: number[], allowance: Allowance, now: number): number {
  const { max, windowMs } = allowance;
  if (!(max >= 1) || !(windowMs > 0)) throw new Error('An allowance needs at least one allowed event and a positive window');
  const recent = times.filter((t) => t > now - windowMs).sort((a, b) => a - b);
  if (recent.length < max) return 0;
  const oldestThatCounts = recent[recent.length - max];
  return Math.max(1, Math.ceil((oldestThatCounts + windowMs - now) / 1000));
}
