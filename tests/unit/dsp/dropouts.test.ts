import { describe, expect, it } from 'vitest';
import { DropoutAnalyzer } from '../../../dsp/analyzers/dropouts';
import { formatOf, runAnalyzer } from '../../support/analyzerHarness';
import { concat, silence, sine } from '../../support/testSignals';

const RATE = 48000;
const dropoutsOf = (channels: Float64Array[], options = {}) => runAnalyzer(new DropoutAnalyzer(formatOf(RATE, channels.length), options), channels, [4096, 333]);
const tone = (seconds: number) => sine(997, 0.3, seconds, RATE, 0.5);

// Dropout = digital zero on every channel, >= 5 ms, inside the take [common practice: 1-10 ms].
describe('dropouts', () => {
  it('finds a 10 ms gap of digital silence inside the take, with its times', () => {
    const signal = concat(tone(1), silence(0.01, RATE), tone(1));
    const result = dropoutsOf([signal, signal.slice()]);
    expect(result.dropouts).toHaveLength(1);
    expect(result.dropouts[0].startSec).toBeCloseTo(1, 3);
    expect(result.dropouts[0].endSec - result.dropouts[0].startSec).toBeCloseTo(0.01, 3);
  });

  it('ignores gaps shorter than 5 ms, silence at the head and tail, and a gap on one channel only', () => {
    const short = concat(tone(1), silence(0.003, RATE), tone(1));
    expect(dropoutsOf([short]).dropouts).toHaveLength(0);
    const padded = concat(silence(1, RATE), tone(1), silence(1, RATE));
    expect(dropoutsOf([padded]).dropouts).toHaveLength(0);
    const gapLeftOnly = concat(tone(1), silence(0.02, RATE), tone(1));
    expect(dropoutsOf([gapLeftOnly, tone(2.02)]).dropouts).toHaveLength(0);
  });

  it('counts several gaps, and honours a custom minimum length', () => {
    const signal = concat(tone(0.5), silence(0.006, RATE), tone(0.5), silence(0.05, RATE), tone(0.5));
    expect(dropoutsOf([signal]).dropoutCount).toBe(2);
    expect(dropoutsOf([signal], { minDurationSec: 0.02 }).dropoutCount).toBe(1);
  });

  it('refuses a zero minimum length', () => {
    expect(() => new DropoutAnalyzer(formatOf(RATE, 1), { minDurationSec: 0 })).toThrow(RangeError);
  });
});
