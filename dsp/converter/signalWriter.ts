import { createWriteStream } from 'node:fs';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { assertCheckRate, CheckSignalRenderer, checkSignalLayout } from './checkSignal';
import { seededRandom } from '../util/seededRandom';

/**
 * Writes the check signal as a WAV file: integer PCM with TPDF dither of ±1 LSB (2 LSB peak to
 * peak) wherever a section drives a channel, so a −60 dB FS tone in a 16-bit file carries
 * benign noise instead of truncation distortion (Lipshitz, Wannamaker & Vanderkooy, "Quantization
 * and Dither: A Theoretical Survey", JAES 1992: TPDF makes the error's power independent of the
 * signal; total error power Q²/4). Silence and undriven channels stay digital zero, so the idle
 * section measures the converter's own noise. Deterministic: the same format gives the same bytes.
 */

export interface CheckSignalFormat {
  /** Hz, 32 000–192 000 (use the recorder's usual rate). */
  sampleRate: number;
  /** Container bits of the PCM samples. */
  bitsPerSample: 16 | 24 | 32;
  /** 1–16. */
  channels: number;
}

export interface CheckSignalOptions {
  /** TPDF dither on driven samples (default true); false truncates by rounding (for tests of the ideal quantiser). */
  dither?: boolean;
}

const BLOCK_FRAMES = 65536;
const DITHER_SEED = 0x7a6b_c0de;

/**
 * RIFF header up to the data chunk. Plain PCM for mono/stereo 16-bit; WAVE_FORMAT_EXTENSIBLE
 * otherwise, as Microsoft's WAVEFORMATEXTENSIBLE documentation asks for more than two channels or
 * more than 16 bits (mask: front centre for mono, front left/right for stereo, none assigned above).
 */
function wavHeader(format: CheckSignalFormat, dataBytes: number): Buffer {
  const { sampleRate, bitsPerSample, channels } = format;
  const extensible = channels > 2 || bitsPerSample > 16;
  const blockAlign = channels * (bitsPerSample / 8);
  const fmt = Buffer.alloc(extensible ? 40 : 16);
  fmt.writeUInt16LE(extensible ? 0xfffe : 1, 0);
  fmt.writeUInt16LE(channels, 2);
  fmt.writeUInt32LE(sampleRate, 4);
  fmt.writeUInt32LE(sampleRate * blockAlign, 8);
  fmt.writeUInt16LE(blockAlign, 12);
  fmt.writeUInt16LE(bitsPerSample, 14);
  if (extensible) {
    fmt.writeUInt16LE(22, 16);
    fmt.writeUInt16LE(bitsPerSample, 18);
    fmt.writeUInt32LE(channels === 1 ? 0x4 : channels === 2 ? 0x3 : 0, 20);
    // KSDATAFORMAT_SUBTYPE_PCM {00000001-0000-0010-8000-00AA00389B71}
    Buffer.from([1, 0, 0, 0, 0, 0, 0x10, 0, 0x80, 0, 0, 0xaa, 0, 0x38, 0x9b, 0x71]).copy(fmt, 24);
  }
  const header = Buffer.alloc(12 + 8 + fmt.length + 8);
  header.write('RIFF', 0, 'latin1');
  header.writeUInt32LE(4 + 8 + fmt.length + 8 + dataBytes + (dataBytes % 2), 4);
  header.write('WAVE', 8, 'latin1');
  header.write('fmt ', 12, 'latin1');
  header.writeUInt32LE(fmt.length, 16);
  fmt.copy(header, 20);
  header.write('data', 20 + fmt.length, 'latin1');
  header.writeUInt32LE(dataBytes, 24 + fmt.length);
  return header;
}

/** @throws RangeError for a format the check signal cannot be written in */
export function assertCheckSignalFormat(format: CheckSignalFormat): void {
  if (![16, 24, 32].includes(format.bitsPerSample)) {
    throw new RangeError(`The check signal is written as 16-, 24- or 32-bit PCM (got ${format.bitsPerSample}).`);
  }
  assertCheckRate(format.sampleRate);
  checkSignalLayout(format.channels);
}

/** The check-signal WAV file as a sequence of buffers (header first), generated as they are read. */
export function* checkSignalWavChunks(format: CheckSignalFormat, options: CheckSignalOptions = {}): Generator<Buffer, void, void> {
  assertCheckSignalFormat(format);
  const { channels, bitsPerSample } = format;
  const renderer = new CheckSignalRenderer(checkSignalLayout(channels), format.sampleRate, bitsPerSample);
  const bytesPerSample = bitsPerSample / 8;
  const dataBytes = renderer.totalFrames * channels * bytesPerSample;
  yield wavHeader(format, dataBytes);

  const dither = options.dither ?? true;
  const uniform = seededRandom(DITHER_SEED);
  const scale = 2 ** (bitsPerSample - 1);
  const samples = Array.from({ length: channels }, () => new Float64Array(BLOCK_FRAMES));
  const driven = Array.from({ length: channels }, () => new Uint8Array(BLOCK_FRAMES));
  for (let start = 0; start < renderer.totalFrames; start += BLOCK_FRAMES) {
    const frames = Math.min(BLOCK_FRAMES, renderer.totalFrames - start);
    renderer.render(start, frames, samples, driven);
    const out = Buffer.alloc(frames * channels * bytesPerSample);
    let offset = 0;
    for (let i = 0; i < frames; i++) {
      for (let c = 0; c < channels; c++) {
        const tpdf = dither && driven[c][i] ? uniform() + uniform() - 1 : 0;
        const code = Math.max(-scale, Math.min(scale - 1, Math.round(samples[c][i] * scale + tpdf)));
        if (bytesPerSample === 2) out.writeInt16LE(code, offset);
        else if (bytesPerSample === 3) out.writeIntLE(code, offset, 3);
        else out.writeInt32LE(code, offset);
        offset += bytesPerSample;
      }
    }
    yield out;
  }
  if (dataBytes % 2) yield Buffer.alloc(1);
}

/** The whole check-signal WAV file in memory (about 11 MB for 48 kHz 24-bit stereo). */
export function checkSignalWav(format: CheckSignalFormat, options: CheckSignalOptions = {}): Buffer {
  return Buffer.concat([...checkSignalWavChunks(format, options)]);
}

/** The check-signal WAV file as a readable stream (for a download response). */
export function checkSignalWavStream(format: CheckSignalFormat, options: CheckSignalOptions = {}): Readable {
  assertCheckSignalFormat(format);
  return Readable.from(checkSignalWavChunks(format, options), { objectMode: false });
}

/** Writes the check-signal WAV file to a path. */
export async function writeCheckSignalFile(path: string, format: CheckSignalFormat, options: CheckSignalOptions = {}): Promise<void> {
  await pipeline(checkSignalWavStream(format, options), createWriteStream(path));
}
