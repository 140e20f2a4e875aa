import { describe, expect, it } from 'vitest';
import { StereoAnalyzer } from '../../../dsp/analyzers/stereo';
import { formatOf, runAnalyzer } from '../../support/analyzerHarness';
import { seededRandom, sine } from '../../support/testSignals';

const RATE = 48000;
const stereoOf = (left: Float64Array, right: Float64Array) => runAnalyzer(new StereoAnalyzer(formatOf(RATE, 2)), [left, right]);

function noise(seconds: number, seed: number): Float64Array {
  const random = seededRandom(seed);
  return new Float64Array(Math.round(seconds * RATE)).map(() => random() - random());
}

// Pearson correlation r = cov(L,R)/sqrt(var L var R) (textbook definition).
describe('stereo', () => {
  it('flags identical channels (a mono take in a stereo file), r = +1', () => {
    const signal = noise(2, 1);
    const result = stereoOf(signal, signal.slice());
    expect(result.identicalChannels).toBe(true);
    expect(result.polarityInverted).toBe(false);
    expect(result.correlation).toBeCloseTo(1, 10);
  });

  it('flags one channel polarity-inverted, r = -1, and anti-phase throughout', () => {
    const signal = noise(2, 2);
    const result = stereoOf(signal, signal.map((x) => -x));
    expect(result.polarityInverted).toBe(true);
    expect(result.identicalChannels).toBe(false);
    expect(result.correlation).toBeCloseTo(-1, 10);
    expect(result.antiPhaseShare).toBe(1);
  });

  it('reads r = a²/(a²+b²) for L = a·C + b·N1, R = a·C + b·N2 with independent noises (±0.02)', () => {
    const common = noise(10, 3);
    const own1 = noise(10, 4);
    const own2 = noise(10, 5);
    const a = 0.8, b = 0.6;
    const left = common.map((x, i) => a * x + b * own1[i]);
    const right = common.map((x, i) => a * x + b * own2[i]);
    const result = stereoOf(left, right);
    expect(Math.abs(result.correlation - (a * a) / (a * a + b * b))).toBeLessThan(0.02);
    expect(result.polarityInverted).toBe(false);
    expect(result.antiPhaseShare).toBe(0);
    // Independent channels read about 0.
    expect(Math.abs(stereoOf(own1, own2).correlation)).toBeLessThan(0.02);
  });

  it('measures the share of windows in anti-phase when only part of the take is inverted', () => {
    const signal = sine(500, 0.5, 10, RATE);
    const right = signal.map((x, i) => (i < 2 * RATE ? -x : x));
    const result = stereoOf(signal, right);
    expect(result.antiPhaseShare).toBeGreaterThan(0.15);
    expect(result.antiPhaseShare).toBeLessThan(0.25);
    expect(result.polarityInverted).toBe(false);
  });

  it('reads 0 correlation when a channel is silent, and needs exactly 2 channels', () => {
    expect(stereoOf(noise(1, 6), new Float64Array(RATE)).correlation).toBe(0);
    expect(() => new StereoAnalyzer(formatOf(RATE, 1))).toThrow(RangeError);
  });
});
