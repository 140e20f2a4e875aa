import { endianness } from 'node:os';
import type { Encoding } from '../types';

const LITTLE_ENDIAN_HOST = endianness() === 'LE';

/**
 * Turns interleaved little-endian WAV bytes into one float64 array per channel,
 * full scale = 1.0. Integer codes are divided by 2^(bits-1), so they stay exact
 * and `sample * 2^(bits-1)` gives back the code. 8-bit PCM is unsigned with
 * its zero at 128 (RIFF spec, reproduced in EBU Tech 3285 appendix A).
 */
export class SampleDecoder {
  private readonly encoding: Encoding;
  private readonly bitsPerSample: number;
  private readonly channelCount: number;
  /** Float samples that were NaN or ±Inf, per channel (they are replaced by 0 before any analyzer sees them). */
  readonly nonFiniteSamples: number[];

  /**
   * @param encoding 'pcm' or 'float'
   * @param bitsPerSample container bits: 8/16/24/32 for PCM, 32/64 for float
   * @param channelCount interleaved channels, 1..64
   */
  constructor(encoding: Encoding, bitsPerSample: number, channelCount: number) {
    this.encoding = encoding;
    this.bitsPerSample = bitsPerSample;
    this.channelCount = channelCount;
    this.nonFiniteSamples = new Array<number>(channelCount).fill(0);
  }

  /**
   * Decodes `frames` frames from `bytes` (which must start on a frame boundary
   * and whose byteOffset must be 8-byte aligned) into `out[channel][0..frames)`.
   * @returns the first frame holding a NaN or ±Inf float sample (replaced by 0), or -1
   */
  decode(bytes: Uint8Array, frames: number, out: Float64Array[]): number {
    const channels = this.channelCount;
    const sampleCount = frames * channels;
    if (this.encoding === 'float') {
      if (this.bitsPerSample === 32) {
        const view = LITTLE_ENDIAN_HOST ? new Float32Array(bytes.buffer, bytes.byteOffset, sampleCount) : null;
        const data = new DataView(bytes.buffer, bytes.byteOffset, sampleCount * 4);
        for (let ch = 0; ch < channels; ch++) {
          const target = out[ch];
          if (view) for (let i = 0, s = ch; i < frames; i++, s += channels) target[i] = view[s];
          else for (let i = 0, s = ch; i < frames; i++, s += channels) target[i] = data.getFloat32(s * 4, true);
        }
      } else {
        const view = LITTLE_ENDIAN_HOST ? new Float64Array(bytes.buffer, bytes.byteOffset, sampleCount) : null;
        const data = new DataView(bytes.buffer, bytes.byteOffset, sampleCount * 8);
        for (let ch = 0; ch < channels; ch++) {
          const target = out[ch];
          if (view) for (let i = 0, s = ch; i < frames; i++, s += channels) target[i] = view[s];
          else for (let i = 0, s = ch; i < frames; i++, s += channels) target[i] = data.getFloat64(s * 8, true);
        }
      }
      return this.zeroNonFinite(out, frames);
    }
    switch (this.bitsPerSample) {
      case 8: {
        for (let ch = 0; ch < channels; ch++) {
          const target = out[ch];
          for (let i = 0, s = ch; i < frames; i++, s += channels) target[i] = (bytes[s] - 128) / 128;
        }
        return -1;
      }
      case 16: {
        const scale = 1 / 32768;
        if (LITTLE_ENDIAN_HOST) {
          const view = new Int16Array(bytes.buffer, bytes.byteOffset, sampleCount);
          for (let ch = 0; ch < channels; ch++) {
            const target = out[ch];
            for (let i = 0, s = ch; i < frames; i++, s += channels) target[i] = view[s] * scale;
          }
        } else {
          for (let ch = 0; ch < channels; ch++) {
            const target = out[ch];
            for (let i = 0, b = ch * 2; i < frames; i++, b += channels * 2) target[i] = (((bytes[b] | (bytes[b + 1] << 8)) << 16) >> 16) * scale;
          }
        }
        return -1;
      }
      case 24: {
        const scale = 1 / 8388608;
        const stride = channels * 3;
        for (let ch = 0; ch < channels; ch++) {
          const target = out[ch];
          // Shift the 24-bit code into the top of an int32 and back to sign-extend it.
          for (let i = 0, b = ch * 3; i < frames; i++, b += stride) target[i] = (((bytes[b] << 8) | (bytes[b + 1] << 16) | (bytes[b + 2] << 24)) >> 8) * scale;
        }
        return -1;
      }
      case 32: {
        const scale = 1 / 2147483648;
        if (LITTLE_ENDIAN_HOST) {
          const view = new Int32Array(bytes.buffer, bytes.byteOffset, sampleCount);
          for (let ch = 0; ch < channels; ch++) {
            const target = out[ch];
            for (let i = 0, s = ch; i < frames; i++, s += channels) target[i] = view[s] * scale;
          }
        } else {
          const data = new DataView(bytes.buffer, bytes.byteOffset, sampleCount * 4);
          for (let ch = 0; ch < channels; ch++) {
            const target = out[ch];
            for (let i = 0, s = ch; i < frames; i++, s += channels) target[i] = data.getInt32(s * 4, true) * scale;
          }
        }
        return -1;
      }
      default:
        throw new Error(`No decoder for ${this.bitsPerSample}-bit PCM`);
    }
  }

  /**
   * Replaces NaN and ±Inf by 0 and counts them, so one bad float sample cannot
   * poison a sum (loudness, DC, spectra) in any analyzer downstream.
   * @returns the first frame that held one, or -1
   */
  private zeroNonFinite(out: Float64Array[], frames: number): number {
    let first = -1;
    for (let ch = 0; ch < this.channelCount; ch++) {
      const target = out[ch];
      let count = 0;
      for (let i = 0; i < frames; i++) {
        // x - x is 0 for every finite x and NaN for NaN and ±Inf.
        if (target[i] - target[i] !== 0) {
          target[i] = 0;
          if (count++ === 0 && (first < 0 || i < first)) first = i;
        }
      }
      this.nonFiniteSamples[ch] += count;
    }
    return first;
  }
}
