import { describe, expect, it } from 'vitest';
import { TruePeakAnalyzer } from '../../../dsp/analyzers/truePeak';
import { TRUE_PEAK_PHASES } from '../../../dsp/filters/truePeakFilter';
import { formatOf, runAnalyzer } from '../../support/analyzerHarness';
import { fadeEnds, seededRandom, sine } from '../../support/testSignals';

const RATE = 48000;
const truePeakDb = (signal: Float64Array, blockSizes?: number[]) =>
  20 * Math.log10(runAnalyzer(new TruePeakAnalyzer(formatOf(RATE, 1)), [signal], blockSizes).channelTruePeaks[0]);

/** Tech 3341 Table 1 tolerance for true peak: +0.2 / -0.4 dB. */
const expectTruePeak = (measured: number, expected: number) => {
  expect(measured).toBeLessThanOrEqual(expected + 0.2);
  expect(measured).toBeGreaterThanOrEqual(expected - 0.4);
};

describe('interpolation filter', () => {
  // Kaiser-windowed sinc (Oppenheim & Schafer's window method): phase 3 is phase 0 reversed,
  // phase 2 is phase 1 reversed, and each phase has unity DC gain.
  it('has mirrored phases of unity DC gain', () => {
    expect(Array.from(TRUE_PEAK_PHASES[3])).toEqual(Array.from(TRUE_PEAK_PHASES[0]).reverse());
    expect(Array.from(TRUE_PEAK_PHASES[2])).toEqual(Array.from(TRUE_PEAK_PHASES[1]).reverse());
    for (const phase of TRUE_PEAK_PHASES) expect(phase.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 12);
  });

  it('passes every frequency up to 20 kHz at 48 kHz within 0.02 dB in every phase (DTFT of the taps)', () => {
    for (let frequency = 0; frequency <= 20000; frequency += 100) {
      const omega = (2 * Math.PI * frequency) / RATE;
      for (const phase of TRUE_PEAK_PHASES) {
        let re = 0;
        let im = 0;
        phase.forEach((tap, k) => {
          re += tap * Math.cos(omega * k);
          im -= tap * Math.sin(omega * k);
        });
        expect(Math.abs(10 * Math.log10(re * re + im * im))).toBeLessThan(0.02);
      }
    }
  });
});

describe('EBU Tech 3341 true-peak cases (Table 1), tolerance +0.2/-0.4 dB', () => {
  // Cases 15-19: tapered with 10 ms fades, "duration does not matter".
  const tone = (fraction: number, amplitude: number, phaseDeg: number) =>
    fadeEnds(sine(RATE * fraction, amplitude, 1, RATE, (phaseDeg * Math.PI) / 180), 0.01, RATE);
  it('case 15: fs/4, 0.50 FFS, phase 0: -6.0 dBTP', () => expectTruePeak(truePeakDb(tone(1 / 4, 0.5, 0)), -6.02));
  it('case 16: fs/4, 0.50 FFS, phase 45: -6.0 dBTP (sample peak -9.03 dBFS)', () => {
    const signal = tone(1 / 4, 0.5, 45);
    expectTruePeak(truePeakDb(signal), -6.02);
    const samplePeak = signal.reduce((peak, x) => Math.max(peak, Math.abs(x)), 0);
    expect(20 * Math.log10(samplePeak)).toBeCloseTo(-9.03, 2);
  });
  it('case 17: fs/6, 0.50 FFS, phase 60: -6.0 dBTP', () => expectTruePeak(truePeakDb(tone(1 / 6, 0.5, 60)), -6.02));
  it('case 18: fs/8, 0.50 FFS, phase 67.5: -6.0 dBTP', () => expectTruePeak(truePeakDb(tone(1 / 8, 0.5, 67.5)), -6.02));
  it('case 19: fs/4, 1.41 FFS, phase 45: +3.0 dBTP', () => expectTruePeak(truePeakDb(tone(1 / 4, 1.41, 45)), 3.0));

  /**
   * Cases 20-23: an fs/6 sine at 0.5 FFS holding one period of an fs/4 sine at 1.0 FFS,
   * phase-continuous, made at 4·fs, low-passed and taken every 4th sample at offsets 0-3.
   */
  function burst(offset: number): Float64Array {
    const highRate = 4 * RATE;
    const frames = highRate; // 1 s
    const high = new Float64Array(frames);
    const burstStart = 96000; // a rising zero crossing of the fs/6 (8 kHz) sine: 96000 = 4000 periods of 24 samples
    const burstLength = 16; // one period of 12 kHz at 192 kHz
    for (let n = 0; n < frames; n++) {
      const inBurst = n >= burstStart && n < burstStart + burstLength;
      high[n] = inBurst ? Math.sin((2 * Math.PI * 12000 * (n - burstStart)) / highRate) : 0.5 * Math.sin((2 * Math.PI * 8000 * n) / highRate);
    }
    fadeEnds(high, 0.01, highRate);
    // Anti-alias low-pass: Blackman-windowed sinc, cut-off 22 kHz, 1023 taps (textbook FIR design).
    const taps = 1023;
    const half = (taps - 1) / 2;
    const cutoff = 22000 / highRate;
    const kernel = new Float64Array(taps);
    let gain = 0;
    for (let k = 0; k < taps; k++) {
      const m = k - half;
      const sinc = m === 0 ? 2 * cutoff : Math.sin(2 * Math.PI * cutoff * m) / (Math.PI * m);
      const window = 0.42 - 0.5 * Math.cos((2 * Math.PI * k) / (taps - 1)) + 0.08 * Math.cos((4 * Math.PI * k) / (taps - 1));
      kernel[k] = sinc * window;
      gain += kernel[k];
    }
    const low = new Float64Array(frames / 4);
    for (let i = 0; i < low.length; i++) {
      const centre = 4 * i + offset;
      let sum = 0;
      for (let k = 0; k < taps; k++) {
        const n = centre + k - half;
        if (n >= 0 && n < frames) sum += kernel[k] * high[n];
      }
      low[i] = sum / gain;
    }
    return low;
  }
  it.each([0, 1, 2, 3])('cases 20-23: burst down-sampled with a %i-sample offset: 0.0 dBTP', (offset) => {
    const measured = truePeakDb(burst(offset));
    expectTruePeak(measured, 0);
  });
});

describe('bound skipping', () => {
  /** The same 4x interpolation computed on every sample, no shortcut. */
  function bruteForce(signal: Float64Array): number {
    let peak = 0;
    const taps = TRUE_PEAK_PHASES[0].length;
    const padded = new Float64Array(signal.length + 2 * (taps - 1));
    padded.set(signal, taps - 1);
    for (let n = taps - 1; n < padded.length; n++) {
      for (const phase of TRUE_PEAK_PHASES) {
        let sum = 0;
        for (let k = 0; k < taps; k++) sum += phase[k] * padded[n - k];
        peak = Math.max(peak, Math.abs(sum));
      }
      peak = Math.max(peak, Math.abs(padded[n]));
    }
    return peak;
  }

  // The analyzer folds the mirrored phases (fewer multiplications), so the sums differ from the
  // brute force's only by rounding: no skipped window may have held the peak.
  it('gives the brute-force result (to rounding) on programme-like and bursty signals, for any block size', () => {
    const random = seededRandom(7);
    const signal = new Float64Array(200_000);
    for (let n = 0; n < signal.length; n++) {
      const envelope = 0.05 + 0.9 * Math.abs(Math.sin(n / 9000)) ** 6;
      signal[n] = envelope * (random() * 2 - 1) * (n % 50_000 < 100 ? 1.2 : 0.5);
    }
    const expected = bruteForce(signal);
    for (const blockSizes of [[65536], [1, 2, 3, 1000], [777]]) {
      const measured = runAnalyzer(new TruePeakAnalyzer(formatOf(RATE, 1)), [signal], blockSizes).channelTruePeaks[0];
      expect(Math.abs(measured - expected)).toBeLessThanOrEqual(1e-12 * expected);
    }
  });

  it('keeps channels apart and never reads below the sample peak', () => {
    const left = sine(RATE / 4, 0.5, 0.5, RATE, Math.PI / 4);
    const right = sine(1000, 0.25, 0.5, RATE);
    const [leftPeak, rightPeak] = runAnalyzer(new TruePeakAnalyzer(formatOf(RATE, 2)), [left, right]).channelTruePeaks;
    expect(20 * Math.log10(leftPeak)).toBeGreaterThan(-6.3);
    expect(rightPeak).toBeGreaterThanOrEqual(right.reduce((peak, x) => Math.max(peak, Math.abs(x)), 0));
    expect(rightPeak).toBeLessThan(0.26);
  });

  it('refuses a format without channels', () => {
    expect(() => new TruePeakAnalyzer(formatOf(RATE, 0))).toThrow(RangeError);
  });
});

describe('where the true peak is', () => {
  it('places the peak of a short loud burst in a quiet take to within a millisecond, for any block size', () => {
    // 3 s of a -30 dBFS tone, with 20 ms of fs/4 at 45° phase (inter-sample peak 3 dB over its samples) at 1.75 s.
    const signal = sine(997, 10 ** (-30 / 20), 3, RATE);
    const burstStart = Math.round(1.75 * RATE);
    for (let i = 0; i < 960; i++) signal[burstStart + i] = 0.5 * Math.sin((Math.PI / 2) * i + Math.PI / 4);
    for (const blocks of [[65536], [4097, 31, 1000], [1]]) {
      const result = runAnalyzer(new TruePeakAnalyzer(formatOf(RATE, 1)), [signal], blocks);
      const atSec = result.channelTruePeakFrames[0] / RATE;
      expect(atSec).toBeGreaterThanOrEqual(1.75 - 0.001);
      expect(atSec).toBeLessThanOrEqual(1.75 + 0.02 + 0.001);
    }
  });

  it('reports each channel at its own time', () => {
    const left = sine(997, 0.01, 2, RATE);
    const right = sine(997, 0.01, 2, RATE);
    left[Math.round(0.5 * RATE)] = 0.9;
    right[Math.round(1.5 * RATE)] = -0.8;
    const { channelTruePeakFrames } = runAnalyzer(new TruePeakAnalyzer(formatOf(RATE, 2)), [left, right]);
    expect(Math.abs(channelTruePeakFrames[0] / RATE - 0.5)).toBeLessThan(0.001);
    expect(Math.abs(channelTruePeakFrames[1] / RATE - 1.5)).toBeLessThan(0.001);
  });
});
