import { describe, expect, it } from 'vitest';
import { LoudnessAnalyzer, gatedIntegratedLoudness, loudnessRange } from '../../../dsp/analyzers/loudness';
import { loudnessChannelWeights } from '../../../dsp/channelWeights';
import { formatOf, runAnalyzer } from '../../support/analyzerHarness';
import { concat, sine, toneSegments } from '../../support/testSignals';

const RATE = 48000;
const measure = (channels: Float64Array[], rate = RATE, overrides = {}) => runAnalyzer(new LoudnessAnalyzer(formatOf(rate, channels.length, overrides)), channels);
const stereo = (signal: Float64Array) => [signal, signal.slice()];

describe('BS.1770 reference readings', () => {
  // BS.1770-4 Annex 1: a 0 dBFS 997 Hz sine on L, C or R reads -3.01 LKFS.
  it('reads -3.01 LKFS for a 0 dBFS 997 Hz sine on one channel at 48 kHz (±0.01)', () => {
    const result = measure([sine(997, 1, 10, RATE)]);
    expect(result.integratedLufs!).toBeCloseTo(-3.01, 1);
    expect(Math.abs(result.integratedLufs! + 3.0103)).toBeLessThan(0.01);
  });

  // Same reference at other rates; bilinear warping of the re-derived filters moves it by up to 0.03 LU (standards notes, computed).
  it.each([44100, 32000, 88200, 96000, 192000])('reads -3.01 LKFS (±0.03) at %i Hz', (rate) => {
    const result = measure([sine(997, 1, 5, rate)], rate);
    expect(Math.abs(result.integratedLufs! + 3.01)).toBeLessThan(0.03);
  });

  // Derived from BS.1770 eq. 2: two in-phase channels double the power (+3.01 LU).
  it('reads 0.00 LKFS (±0.01) for the tone on left and right', () => {
    expect(Math.abs(measure(stereo(sine(997, 1, 10, RATE))).integratedLufs!)).toBeLessThan(0.01);
  });

  // BS.1770 Table 3: surrounds weigh 1.41, so the tone on Ls alone reads -3.01 + 10·log10(1.41) = -1.52 LKFS.
  it('weights a 5.0 surround channel by 1.41 (-1.52 LKFS ±0.01)', () => {
    const tone = sine(997, 1, 10, RATE);
    const quiet = new Float64Array(tone.length);
    const result = measure([quiet, quiet, quiet, tone, quiet]);
    expect(Math.abs(result.integratedLufs! + 1.52)).toBeLessThan(0.01);
  });

  // BS.1770 Annex 1: the LFE channel is excluded. WAVE 5.1 mask 0x3F: FL FR FC LFE BL BR.
  it('leaves the LFE out of a 5.1 take (mask 0x3F) and weighs its back channels as surrounds', () => {
    const tone = sine(997, 1, 5, RATE);
    const quiet = new Float64Array(tone.length);
    const lfeOnly = measure([quiet, quiet, quiet, tone, quiet, quiet], RATE, { channelMask: 0x3f });
    expect(lfeOnly.integratedLufs).toBeNull();
    const backLeft = measure([quiet, quiet, quiet, quiet, tone, quiet], RATE, { channelMask: 0x3f });
    expect(Math.abs(backLeft.integratedLufs! + 1.52)).toBeLessThan(0.01);
    expect(Array.from(loudnessChannelWeights(6, null))).toEqual([1, 1, 1, 0, 1.41, 1.41]);
  });

  it('gives no loudness for a take shorter than one 400 ms gating block, or silent', () => {
    const short = measure([sine(997, 0.5, 0.35, RATE)]);
    expect(short.integratedLufs).toBeNull();
    expect(short.momentaryMaxLufs).toBeNull();
    expect(measure([new Float64Array(RATE * 2)]).integratedLufs).toBeNull();
  });

  it('refuses an impossible configuration', () => {
    expect(() => new LoudnessAnalyzer(formatOf(0, 1))).toThrow(RangeError);
    expect(() => new LoudnessAnalyzer(formatOf(48000, 2), { channelWeights: [1] })).toThrow(RangeError);
  });
});

describe('EBU Tech 3341 minimum requirements (Table 1), tolerance ±0.1 LU', () => {
  const within = (value: number | null, expected: number, tolerance = 0.1) => {
    expect(value).not.toBeNull();
    expect(Math.abs(value! - expected)).toBeLessThanOrEqual(tolerance);
  };

  it('case 1: stereo 1 kHz at -23 dBFS, 20 s: M, S, I = -23.0', () => {
    const result = measure(stereo(toneSegments([[20, -23]], RATE)));
    within(result.integratedLufs, -23);
    within(result.momentaryMaxLufs, -23);
    within(result.shortTermMaxLufs, -23);
  });

  it('case 2: as case 1 at -33 dBFS: M, S, I = -33.0', () => {
    const result = measure(stereo(toneSegments([[20, -33]], RATE)));
    within(result.integratedLufs, -33);
    within(result.momentaryMaxLufs, -33);
    within(result.shortTermMaxLufs, -33);
  });

  it('case 3: 10 s at -36, 60 s at -23, 10 s at -36 dBFS: I = -23.0', () => {
    within(measure(stereo(toneSegments([[10, -36], [60, -23], [10, -36]], RATE))).integratedLufs, -23);
  });

  it('case 4: -72, -36, -23 (60 s), -36, -72 dBFS: I = -23.0', () => {
    within(measure(stereo(toneSegments([[10, -72], [10, -36], [60, -23], [10, -36], [10, -72]], RATE))).integratedLufs, -23);
  });

  it('case 5: 20 s at -26, 20.1 s at -20, 20 s at -26 dBFS: I = -23.0', () => {
    within(measure(stereo(toneSegments([[20, -26], [20.1, -20], [20, -26]], RATE))).integratedLufs, -23);
  });

  it('case 6: 5.0 channels, -28 dBFS L/R, -24 C, -30 Ls/Rs: I = -23.0', () => {
    const side = toneSegments([[20, -28]], RATE);
    const centre = toneSegments([[20, -24]], RATE);
    const surround = toneSegments([[20, -30]], RATE);
    within(measure([side, side.slice(), centre, surround, surround.slice()]).integratedLufs, -23);
  });

  // The Tech 3341 test-set readme: case 6 also exists as a 6-channel WAVE_FORMAT_EXTENSIBLE file with a silent LFE.
  it('case 6, 5.1 version: the same with a silent LFE in a mask-0x3F layout: I = -23.0', () => {
    const side = toneSegments([[20, -28]], RATE);
    const centre = toneSegments([[20, -24]], RATE);
    const surround = toneSegments([[20, -30]], RATE);
    within(measure([side, side.slice(), centre, new Float64Array(side.length), surround, surround.slice()], RATE, { channelMask: 0x3f }).integratedLufs, -23);
  });

  it('case 9: (1.34 s at -20, 1.66 s at -30 dBFS) x 5: S = -23.0 (max short-term)', () => {
    const result = measure(stereo(toneSegments(Array.from({ length: 5 }, () => [[1.34, -20], [1.66, -30]] as [number, number][]).flat(), RATE)));
    within(result.shortTermMaxLufs, -23);
    // Constant after 3 s: every full 3 s window of the plot series reads -23.0 as well.
    const full = result.shortTermSeries.values.slice(2);
    for (const value of full) within(value, -23);
  });

  it('case 10: 20 segments of i·0.15 s silence, 3 s at -23 dBFS, 1 s silence: max S of each = -23.0', () => {
    for (let i = 0; i < 20; i += 3) {
      const segment = toneSegments([[i * 0.15, null], [3, -23], [1, null]], RATE);
      within(measure(stereo(segment)).shortTermMaxLufs, -23);
    }
  });

  it('case 12: (0.18 s at -20, 0.22 s at -30 dBFS) x 25: M = -23.0 (max momentary)', () => {
    const result = measure(stereo(toneSegments(Array.from({ length: 25 }, () => [[0.18, -20], [0.22, -30]] as [number, number][]).flat(), RATE)));
    within(result.momentaryMaxLufs, -23);
  });

  it('case 13: 20 segments of i·20 ms silence, 400 ms at -23 dBFS, 1 s silence: max M of each = -23.0', () => {
    const segments = Array.from({ length: 20 }, (_, i) => toneSegments([[i * 0.02, null], [0.4, -23], [1, null]], RATE));
    for (const segment of segments) within(measure(stereo(segment)).momentaryMaxLufs, -23);
    // The whole sequence as one file as well.
    within(measure(stereo(concat(...segments))).momentaryMaxLufs, -23);
  });
});

describe('EBU Tech 3342 loudness range (Table 1), tolerance ±1 LU', () => {
  const lra = (segments: [number, number][]) => measure(stereo(toneSegments(segments, RATE))).rangeLu!;
  it('case 1: -20 then -30 dBFS, 20 s each: LRA = 10', () => expect(Math.abs(lra([[20, -20], [20, -30]]) - 10)).toBeLessThanOrEqual(1));
  it('case 2: -20 then -15 dBFS: LRA = 5', () => expect(Math.abs(lra([[20, -20], [20, -15]]) - 5)).toBeLessThanOrEqual(1));
  it('case 3: -40 then -20 dBFS: LRA = 20', () => expect(Math.abs(lra([[20, -40], [20, -20]]) - 20)).toBeLessThanOrEqual(1));
  it('case 4: -50, -35, -20, -35, -50 dBFS: LRA = 15', () => {
    expect(Math.abs(lra([[20, -50], [20, -35], [20, -20], [20, -35], [20, -50]]) - 15)).toBeLessThanOrEqual(1);
  });

  // Tech 3342 3.1 reference code, worked by hand: levels [-30 x 10, -20 x 10] -> gate keeps all,
  // sorted rank round(19·0.10 + 1) = 3 -> -30, rank round(19·0.95 + 1) = 19 -> -20: LRA 10.
  it('uses nearest-rank percentiles of the reference code', () => {
    const levels = Float64Array.from([...Array(10).fill(-20), ...Array(10).fill(-30)]);
    expect(loudnessRange(levels)).toBe(10);
    // A level below the relative gate (power mean - 20 LU) is dropped: -60 does not widen the range.
    expect(loudnessRange(Float64Array.from([...levels, -60]))).toBe(10);
    expect(loudnessRange(Float64Array.from([-80, -90]))).toBeNull();
  });
});

describe('block independence', () => {
  it('gives the same figures whatever the block sizes', () => {
    const signal = toneSegments([[3, -30], [4.05, -18], [2, null], [3, -25]], RATE);
    const once = runAnalyzer(new LoudnessAnalyzer(formatOf(RATE, 1)), [signal], [signal.length]);
    const pieces = runAnalyzer(new LoudnessAnalyzer(formatOf(RATE, 1)), [signal], [1, 479, 480, 481, 65536, 7]);
    // Equal up to float rounding (sums are associated differently across block joins).
    for (const key of ['integratedLufs', 'rangeLu', 'momentaryMaxLufs', 'shortTermMaxLufs'] as const) expect(pieces[key]!).toBeCloseTo(once[key]!, 9);
    expect(pieces.shortTermSeries.values).toHaveLength(once.shortTermSeries.values.length);
  });
});

describe('gating (BS.1770-4 eqs. 3-7)', () => {
  // Block loudness l = -0.691 + 10·log10(z). Worked example: blocks at -20 LKFS and -40 LKFS (z = 10^((l+0.691)/10)).
  const z = (lufs: number) => 10 ** ((lufs + 0.691) / 10);
  it('drops blocks 10 LU below the absolute-gated mean and those under -70 LKFS', () => {
    // Mean of z over {-20, -40} is about -23 LKFS, relative gate about -33: the -40 block is dropped.
    expect(gatedIntegratedLoudness(Float64Array.from([z(-20), z(-40)]))!).toBeCloseTo(-20, 10);
    expect(gatedIntegratedLoudness(Float64Array.from([z(-20), z(-25)]))!).toBeCloseTo(-0.691 + 10 * Math.log10((z(-20) + z(-25)) / 2), 10);
    expect(gatedIntegratedLoudness(Float64Array.from([z(-71), z(-75)]))).toBeNull();
  });
});

describe('short-term series for plotting', () => {
  it('holds one value per second, null where the audio is below the absolute gate', () => {
    const result = measure(stereo(toneSegments([[5, -23], [5, null]], RATE)));
    expect(result.shortTermSeries.stepSec).toBe(1);
    expect(result.shortTermSeries.values).toHaveLength(10);
    expect(Math.abs(result.shortTermSeries.values[3]! + 23)).toBeLessThan(0.1);
    expect(result.shortTermSeries.values[9]).toBeNull();
  });
});
