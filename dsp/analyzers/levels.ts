import type { Analyzer, AudioFormat, SampleBlock } from '../types';

/** A channel whose AC level stays below this carries no signal [common practice]: 16-bit TPDF dither alone reads about -101 dBFS. */
export const SILENT_CHANNEL_DBFS = -90;
/** Float samples are tested against the 24-bit integer grid (the finest grid a float32 mantissa holds at full scale). */
const FLOAT_GRID_BITS = 24;
const FLOAT_GRID_SCALE = 2 ** (FLOAT_GRID_BITS - 1);

export interface ChannelLevels {
  /** Largest |sample|, full scale = 1.0. */
  samplePeak: number;
  /** Mean square, full scale = 1.0 (a full-scale square wave has 1.0). */
  meanSquare: number;
  /** Mean sample value (DC offset), full scale = 1.0. */
  dcOffset: number;
  /** Bits that carry information: container bits minus the trailing zero bits common to every sample. */
  effectiveBits: number;
  silent: boolean;
}

export interface LevelsResult {
  channels: ChannelLevels[];
}

/** Counts trailing zero bits of a non-zero 32-bit integer. */
function trailingZeroBits(value: number): number {
  return 31 - Math.clz32(value & -value);
}

/**
 * Per-channel sample peak, mean square, DC and effective bits.
 * Effective bits: OR every integer code and count the trailing zeros, so a
 * 24-bit file whose low 8 bits are never used reads 16. Float samples are
 * tested against the 24-bit grid; a float file holding 16- or 24-bit values
 * reads 16 or 24, and one with values off that grid reads its container bits.
 */
export class LevelsAnalyzer implements Analyzer<LevelsResult> {
  private readonly format: AudioFormat;
  private readonly peaks: Float64Array;
  private readonly sums: Float64Array;
  private readonly squareSums: Float64Array;
  /** OR of all integer codes per channel (codes on the float's 24-bit grid for float files). */
  private readonly codeBitsUsed: Int32Array;
  /** Float files only: a sample was found off the 24-bit grid. */
  private readonly offGrid: Uint8Array;
  private frames = 0;

  /** @param format encoding and bits decide the integer grid */
  constructor(format: AudioFormat) {
    if (!(format.channels >= 1)) throw new RangeError('Levels need at least one channel');
    this.format = format;
    this.peaks = new Float64Array(format.channels);
    this.sums = new Float64Array(format.channels);
    this.squareSums = new Float64Array(format.channels);
    this.codeBitsUsed = new Int32Array(format.channels);
    this.offGrid = new Uint8Array(format.channels);
  }

  push(block: SampleBlock): void {
    const frames = block.frames;
    const isFloat = this.format.encoding === 'float';
    const codeScale = isFloat ? FLOAT_GRID_SCALE : 2 ** (this.format.bitsPerSample - 1);
    for (let channel = 0; channel < this.format.channels; channel++) {
      const samples = block.channels[channel];
      let peak = this.peaks[channel];
      let sum = 0;
      let squareSum = 0;
      let bitsUsed = this.codeBitsUsed[channel];
      for (let i = 0; i < frames; i++) {
        const x = samples[i];
        const magnitude = x < 0 ? -x : x;
        if (magnitude > peak) peak = magnitude;
        sum += x;
        squareSum += x * x;
        // Integer codes are exact in float64, so `| 0` of code·scale is the code itself.
        bitsUsed |= x * codeScale;
      }
      if (isFloat && this.offGrid[channel] === 0) {
        for (let i = 0; i < frames; i++) {
          const code = samples[i] * codeScale;
          if (code !== Math.trunc(code) || code >= 2147483648 || code < -2147483648) {
            this.offGrid[channel] = 1;
            break;
          }
        }
      }
      this.peaks[channel] = peak;
      this.sums[channel] += sum;
      this.squareSums[channel] += squareSum;
      this.codeBitsUsed[channel] = bitsUsed;
    }
    this.frames += frames;
  }

  finish(): LevelsResult {
    const frames = Math.max(1, this.frames);
    const gridBits = this.format.encoding === 'float' ? FLOAT_GRID_BITS : this.format.bitsPerSample;
    const channels = Array.from({ length: this.format.channels }, (_, channel): ChannelLevels => {
      const meanSquare = this.squareSums[channel] / frames;
      const dcOffset = this.sums[channel] / frames;
      const acPower = Math.max(0, meanSquare - dcOffset * dcOffset);
      const bitsUsed = this.codeBitsUsed[channel];
      let effectiveBits: number;
      if (this.format.encoding === 'float' && this.offGrid[channel]) effectiveBits = this.format.bitsPerSample;
      else effectiveBits = bitsUsed === 0 ? 0 : gridBits - trailingZeroBits(bitsUsed);
      return {
        samplePeak: this.peaks[channel],
        meanSquare,
        dcOffset,
        effectiveBits,
        silent: acPower === 0 || 10 * Math.log10(acPower) < SILENT_CHANNEL_DBFS,
      };
    });
    return { channels };
  }
}
