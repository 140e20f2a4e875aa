import { describe, expect, it } from 'vitest';
import { DropoutAnalyzer } from '../../../dsp/analyzers/dropouts';
import { formatOf, runAnalyzer } from '../../support/analyzerHarness';
import { concat, seededRandom, silence, sine } from '../../support/testSignals';

const RATE = 48000;
const dropoutsOf = (channels: Float64Array[], options = {}) => runAnalyzer(new DropoutAnalyzer(formatOf(RATE, channels.length), options), channels, [4096, 333]);
const tone = (seconds: number) => sine(997, 0.3, seconds, RATE, 0.5);

// Dropout = digital zero on every channel, >= 5 ms, inside the take.
describe('dropouts: digital zero on every channel, >= 5 ms, inside the take [common practice: 1-10 ms]', () => {
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

  it('at 44.1 kHz a 5 ms gap is 220 samples (5 ms is 220.5): found; 219 samples are not [common practice: 5 ms minimum]', () => {
    const rate = 44100;
    const music = sine(997, 0.3, 1, rate, 0.5);
    const withGap = (samples: number) => concat(music, new Float64Array(samples), music);
    const found = (samples: number) => runAnalyzer(new DropoutAnalyzer(formatOf(rate, 1)), [withGap(samples)]).dropoutCount;
    expect(found(220)).toBe(1);
    expect(found(219)).toBe(0);
  });

  it('counts several gaps, and honours a custom minimum length', () => {
    const signal = concat(tone(0.5), silence(0.006, RATE), tone(0.5), silence(0.05, RATE), tone(0.5));
    expect(dropoutsOf([signal]).dropoutCount).toBe(2);
    expect(dropoutsOf([signal], { minDurationSec: 0.02 }).dropoutCount).toBe(1);
  });

  it('finds a 20 ms gap in speech-like material over room noise, which never reaches digital zero by itself', () => {
    const random = seededRandom(3);
    const take = tone(4).map((x, i) => x * (0.5 + 0.5 * Math.sin(i / 3000)) + 3e-4 * (random() - random()));
    take.fill(0, 2 * RATE, 2.02 * RATE);
    const result = dropoutsOf([take]);
    expect(result.dropouts).toHaveLength(1);
    expect(result.silentPauses).toBe(false);
  });

  it('gated or synthesised material that falls to digital silence in its own pauses: the gaps are counted but marked unjudgeable', () => {
    // Words with digital silence between them, as espeak-ng and a noise gate produce: 40-200 ms pauses.
    const parts: Float64Array[] = [];
    for (let word = 0; word < 12; word++) parts.push(tone(0.3), silence(word % 4 === 0 ? 0.2 : 0.04, RATE));
    const result = dropoutsOf([concat(...parts, tone(0.3))]);
    expect(result.dropoutCount).toBe(12);
    expect(result.silentPauses).toBe(true);
  });

  it('refuses a zero minimum length', () => {
    expect(() => new DropoutAnalyzer(formatOf(RATE, 1), { minDurationSec: 0 })).toThrow(RangeError);
  });
});
