import { roundTo } from '../util/decibels';
import type { SampleBlock } from '../types';
import type { BlockVisitor } from './capture';
import type { CheckSection } from './checkSignal';
import type { ConverterChannelReport, CrosstalkPath } from './report';

/** Crosstalk below this is reported as this (an undriven channel of digital zero has none at all), dB. */
const CROSSTALK_FLOOR_DB = -200;

/** Frames between exact recomputations of the rotating phasors (keeps rounding drift far below 1e-12). */
const RESYNC_FRAMES = 4096;

/**
 * Crosstalk tones measured as the recording streams past: for each one-channel section and each
 * tone, every channel's Hann-windowed correlation with e^{−iω(n − from)} at the recorder's exact
 * tone frequency; amplitude = 2·|Σ w·x·e^{−iωn}| / Σ w (a single-bin DFT at a known frequency, so
 * no scalloping; the other tone is thousands of bins away under Hann side lobes). Nothing is kept
 * but the sums.
 */
export class CrosstalkMeter implements BlockVisitor {
  readonly endFrame: number;
  private readonly spans: { from: number; to: number }[];
  private readonly omegas: number[];
  /** sums[span][tone][channel] as [re, im] */
  private readonly sums: Float64Array[][];
  private readonly windowSums: number[];

  /**
   * @param spans frame ranges, one per crosstalk section
   * @param omegas tone frequencies, rad/sample at the recording's rate
   */
  constructor(spans: { from: number; to: number }[], omegas: number[], channels: number) {
    this.spans = spans;
    this.omegas = omegas;
    this.endFrame = Math.max(...spans.map((span) => span.to));
    this.sums = spans.map(() => omegas.map(() => new Float64Array(2 * channels)));
    this.windowSums = spans.map(() => 0);
  }

  push(block: SampleBlock): void {
    const blockEnd = block.startFrame + block.frames;
    this.spans.forEach(({ from, to }, s) => {
      const first = Math.max(from, block.startFrame);
      const last = Math.min(to, blockEnd);
      if (first >= last) return;
      const length = to - from;
      for (let start = first; start < last; start += RESYNC_FRAMES) {
        const stop = Math.min(last, start + RESYNC_FRAMES);
        for (let n = start; n < stop; n++) this.windowSums[s] += 0.5 - 0.5 * Math.cos((2 * Math.PI * (n - from)) / length);
        this.omegas.forEach((omega, t) => this.accumulate(block, s, t, omega, start, stop, from, length));
      }
    });
  }

  /** Amplitudes[span][tone][channel], full scale 1.0. */
  amplitudes(): number[][][] {
    return this.sums.map((tones, s) => tones.map((sums) => {
      const out: number[] = [];
      for (let c = 0; c < sums.length / 2; c++) out.push((2 * Math.hypot(sums[2 * c], sums[2 * c + 1])) / this.windowSums[s]);
      return out;
    }));
  }

  private accumulate(block: SampleBlock, s: number, t: number, omega: number, start: number, stop: number, from: number, length: number): void {
    const sums = this.sums[s][t];
    const stepRe = Math.cos(omega);
    const stepIm = -Math.sin(omega);
    const channels = block.channels.length;
    let re = Math.cos(omega * (start - from));
    let im = -Math.sin(omega * (start - from));
    for (let n = start; n < stop; n++) {
      const w = 0.5 - 0.5 * Math.cos((2 * Math.PI * (n - from)) / length);
      const i = n - block.startFrame;
      for (let c = 0; c < channels; c++) {
        const v = w * block.channels[c][i];
        sums[2 * c] += v * re;
        sums[2 * c + 1] += v * im;
      }
      const nextRe = re * stepRe - im * stepIm;
      im = re * stepIm + im * stepRe;
      re = nextRe;
    }
  }
}

/**
 * Leakage paths from the measured amplitudes: in each one-channel section, every other live
 * channel's level at each tone relative to the driven channel's. Also sets each channel's worst
 * `crosstalkIntoDb`.
 * @param amplitudes [section][tone][channel], as CrosstalkMeter.amplitudes() gives them
 */
export function leakagePaths(amplitudes: number[][][], sections: CheckSection[], channels: ConverterChannelReport[]): CrosstalkPath[] {
  const paths: CrosstalkPath[] = [];
  sections.forEach((section, s) => {
    const driven = section.drivenChannel!;
    if (channels[driven].dead) return;
    channels.forEach((channel, into) => {
      if (into === driven || channel.dead) return;
      const db = amplitudes[s].map((levels) => roundTo(Math.max(CROSSTALK_FLOOR_DB, 20 * Math.log10(levels[into] / levels[driven])), 2));
      paths.push({ driven, into, db });
      channel.crosstalkIntoDb = Math.max(channel.crosstalkIntoDb ?? Number.NEGATIVE_INFINITY, ...db);
    });
  });
  return paths;
}
