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

// A delayed copy of a voice on the other microphone is in anti-phase at some frequencies (comb filter), so
// windows of a plain correlation go negative; the sign of the coherence-weighted cross-correlation peak at
// the delay (smoothed coherence transform, Carter, Nuttall & Cable 1973) is the wiring's polarity [common practice].
describe('polarity of two microphones with bleed between them', () => {
  /** A voice-like signal: low-passed noise in 0.7 s phrases with pauses. */
  function voice(seconds: number, seed: number, phraseOffset: number): Float64Array {
    const random = seededRandom(seed);
    const pole = Math.exp((-2 * Math.PI * 2500) / RATE);
    let low = 0;
    return new Float64Array(Math.round(seconds * RATE)).map((_, i) => {
      low = pole * low + (1 - pole) * (random() - random());
      return Math.floor((i / RATE + phraseOffset) / 0.7) % 2 === 0 ? 2 * low : 0.003 * low;
    });
  }
  const delayed = (signal: Float64Array, frames: number) => new Float64Array(signal.length).map((_, i) => (i >= frames ? signal[i - frames] : 0));
  /** Each voice on its own microphone, and `bleed` of it 2.5 ms later on the other. */
  function twoMics(bleed: number): [Float64Array, Float64Array] {
    const a = voice(20, 1, 0), b = voice(20, 2, 0.7);
    const delay = Math.round(0.0025 * RATE);
    const da = delayed(a, delay), db = delayed(b, delay);
    return [a.map((x, i) => x + bleed * db[i]), b.map((x, i) => x + bleed * da[i])];
  }

  it('two voices with bleed at -14 dB: in polarity, although many 400 ms windows read negative', () => {
    const [left, right] = twoMics(0.2);
    const result = stereoOf(left, right);
    expect(result.polarityInverted).toBe(false);
    expect(result.polarity.inPolaritySegments).toBeGreaterThan(0);
    expect(result.polarity.invertedSegments).toBe(0);
  });

  it('the same with one microphone wired inverted: in opposite polarity', () => {
    const [left, right] = twoMics(0.2);
    const result = stereoOf(left, right.map((x) => -x));
    expect(result.polarityInverted).toBe(true);
    expect(result.polarity.inPolaritySegments).toBe(0);
  });

  it('two isolated voices (no bleed): nothing to compare, so no verdict either way', () => {
    const [left, right] = twoMics(0);
    const result = stereoOf(left, right.map((x) => -x));
    expect(result.polarityInverted).toBe(false);
    expect(result.polarity.inPolaritySegments + result.polarity.invertedSegments).toBe(0);
  });

  it('a stereo pair inverted from 10 s on: the inverted stretch is reported', () => {
    const common = voice(20, 3, 0);
    const right = common.map((x, i) => (i >= 10 * RATE ? -0.8 * x : 0.8 * x));
    const result = stereoOf(common, right);
    expect(result.polarityInverted).toBe(true);
    expect(result.polarity.invertedFromSec).toBeGreaterThan(9);
    expect(result.polarity.invertedFromSec).toBeLessThan(11);
    expect(result.polarity.invertedToSec).toBeGreaterThan(19);
  });

  /**
   * A widened mix: L' = M + w·S, R' = M - w·S (the mid-side matrix of a stereo widener, e.g. Bob Katz,
   * Mastering Audio, 2007). With w = 2 a source panned to the left (L = 1, R = 0.2) comes out at -0.4 on
   * the right: the side content is in anti-phase in every bin it fills, while the loud centre (here a
   * bass line) stays in phase and the mono sum 2M loses nothing.
   */
  function widenedMix(width: number): [Float64Array, Float64Array] {
    const bass = sine(98, 0.4, 20, RATE).map((x, i) => x + 0.3 * Math.sin((2 * Math.PI * 147 * i) / RATE));
    const panned = noise(20, 12).map((x) => 0.25 * x);
    const left = bass.map((x, i) => x + panned[i]), right = bass.map((x, i) => x + 0.2 * panned[i]);
    const mid = left.map((x, i) => (x + right[i]) / 2), side = left.map((x, i) => (x - right[i]) / 2);
    return [mid.map((x, i) => x + width * side[i]), mid.map((x, i) => x - width * side[i])];
  }

  it('a mix widened by 6 dB of side: in polarity (the centre is), although its side content is in anti-phase', () => {
    const [left, right] = widenedMix(2);
    const result = stereoOf(left, right);
    expect(result.correlation).toBeGreaterThan(0);
    expect(result.polarityInverted).toBe(false);
    expect(result.polarity.invertedSegments).toBe(0);
  });

  /** A spaced pair: a bass line reaching the left microphone 2.5 ms early, a wideband source the right one 2.5 ms early. */
  function spacedPair(): [Float64Array, Float64Array] {
    const bass = sine(98, 0.4, 20, RATE).map((x, i) => x + 0.3 * Math.sin((2 * Math.PI * 147 * i) / RATE));
    const source = noise(20, 13).map((x) => 0.2 * x);
    const delay = Math.round(0.0025 * RATE);
    return [bass.map((x, i) => x + (i >= delay ? source[i - delay] : 0)), bass.map((x, i) => (i >= delay ? bass[i - delay] : 0) + source[i])];
  }

  it('a spaced pair whose sources arrive 2.5 ms apart each way: in polarity; with one channel inverted: opposite', () => {
    const [left, right] = spacedPair();
    const normal = stereoOf(left, right);
    expect(normal.polarityInverted).toBe(false);
    expect(normal.polarity.invertedSegments).toBe(0);
    const inverted = stereoOf(left, right.map((x) => -x));
    expect(inverted.polarityInverted).toBe(true);
    expect(inverted.polarity.inPolaritySegments).toBe(0);
  });
});
