import { closeSync, openSync, readSync } from 'node:fs';

/**
 * Takeproof waveform peaks file ("TPPK", version 1): per-channel minimum and
 * maximum sample values of consecutive buckets of frames, at several zoom
 * levels, for drawing a take's waveform without reading its audio.
 *
 * All numbers little-endian. Header (32 bytes), then one 24-byte entry per level,
 * then the levels' data in the order of the table:
 *
 * | offset | size | field |
 * |---|---|---|
 * | 0  | 4 | magic `TPPK` (ASCII) |
 * | 4  | 2 | version, u16 = 1 |
 * | 6  | 2 | channels, u16 |
 * | 8  | 4 | sample rate, u32, Hz |
 * | 12 | 4 | reserved, 0 |
 * | 16 | 8 | total frames, f64 (an exact integer) |
 * | 24 | 2 | level count L, u16 |
 * | 26 | 2 | value format, u16: 1 = int16 |
 * | 28 | 4 | reserved, 0 |
 * | 32 + 24·i | 4 | level i: frames per bucket, u32 |
 * | +4  | 4 | reserved, 0 |
 * | +8  | 8 | level i: bucket count, f64 = ceil(total frames / frames per bucket) |
 * | +16 | 8 | level i: byte offset of its data from the start of the file, f64 |
 *
 * A level's data is bucket-major: for each bucket, for each channel, an int16
 * minimum then an int16 maximum (4 bytes per channel per bucket). A value v
 * stands for v / 32767 of full scale; the minimum is rounded down and the
 * maximum up, so the drawn envelope always encloses the samples. The last
 * bucket may hold fewer frames. Samples beyond ±1.0 (float files) are clamped.
 */
export const PEAKS_MAGIC = 'TPPK';
export const PEAKS_VERSION = 1;
export const PEAKS_HEADER_BYTES = 32;
export const PEAKS_LEVEL_ENTRY_BYTES = 24;
export const PEAKS_VALUE_INT16 = 1;
export const PEAKS_SCALE = 32767;

export interface PeaksLevelInfo {
  framesPerBucket: number;
  bucketCount: number;
  dataOffset: number;
}

export interface PeaksHeader {
  version: number;
  channels: number;
  sampleRate: number;
  totalFrames: number;
  durationSec: number;
  levels: PeaksLevelInfo[];
}

export interface PeaksLevel {
  channels: number;
  sampleRate: number;
  totalFrames: number;
  durationSec: number;
  framesPerBucket: number;
  /** Per channel, one value per bucket, −1…1 of full scale. */
  min: Float32Array[];
  max: Float32Array[];
}

/** Encodes the fixed header and level table. */
export function encodePeaksHeader(header: Omit<PeaksHeader, 'version' | 'durationSec'>): Buffer {
  const buf = Buffer.alloc(PEAKS_HEADER_BYTES + PEAKS_LEVEL_ENTRY_BYTES * header.levels.length);
  buf.write(PEAKS_MAGIC, 0, 'latin1');
  buf.writeUInt16LE(PEAKS_VERSION, 4);
  buf.writeUInt16LE(header.channels, 6);
  buf.writeUInt32LE(header.sampleRate, 8);
  buf.writeDoubleLE(header.totalFrames, 16);
  buf.writeUInt16LE(header.levels.length, 24);
  buf.writeUInt16LE(PEAKS_VALUE_INT16, 26);
  header.levels.forEach((level, i) => {
    const o = PEAKS_HEADER_BYTES + PEAKS_LEVEL_ENTRY_BYTES * i;
    buf.writeUInt32LE(level.framesPerBucket, o);
    buf.writeDoubleLE(level.bucketCount, o + 8);
    buf.writeDoubleLE(level.dataOffset, o + 16);
  });
  return buf;
}

/**
 * Parses the header and level table.
 * @throws Error when the bytes are not a peaks file of a known version.
 */
export function readPeaksHeader(bytes: Uint8Array): PeaksHeader {
  const buf = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (buf.length < PEAKS_HEADER_BYTES || buf.toString('latin1', 0, 4) !== PEAKS_MAGIC) {
    throw new Error('Not a Takeproof peaks file (no TPPK header).');
  }
  const version = buf.readUInt16LE(4);
  if (version !== PEAKS_VERSION) throw new Error(`Peaks file version ${version} is not supported (expected ${PEAKS_VERSION}).`);
  if (buf.readUInt16LE(26) !== PEAKS_VALUE_INT16) throw new Error('Peaks file value format is not int16.');
  const channels = buf.readUInt16LE(6);
  const sampleRate = buf.readUInt32LE(8);
  const totalFrames = buf.readDoubleLE(16);
  const count = buf.readUInt16LE(24);
  if (buf.length < PEAKS_HEADER_BYTES + PEAKS_LEVEL_ENTRY_BYTES * count) throw new Error('Peaks file level table is cut short.');
  const levels: PeaksLevelInfo[] = [];
  for (let i = 0; i < count; i++) {
    const o = PEAKS_HEADER_BYTES + PEAKS_LEVEL_ENTRY_BYTES * i;
    levels.push({ framesPerBucket: buf.readUInt32LE(o), bucketCount: buf.readDoubleLE(o + 8), dataOffset: buf.readDoubleLE(o + 16) });
  }
  return { version, channels, sampleRate, totalFrames, durationSec: sampleRate > 0 ? totalFrames / sampleRate : 0, levels };
}

/** The finest level with at most `maxBuckets` buckets (the coarsest when none is that small). */
export function pickPeaksLevel(header: PeaksHeader, maxBuckets: number): PeaksLevelInfo {
  const sorted = [...header.levels].sort((a, b) => a.framesPerBucket - b.framesPerBucket);
  return sorted.find((l) => l.bucketCount <= maxBuckets) ?? sorted[sorted.length - 1];
}

/**
 * Reads one zoom level from a peaks file (path: only the header and that level
 * are read) or from its bytes.
 * @param framesPerBucket one of the file's levels
 * @throws Error when the file has no such level or is cut short
 */
export function readPeaksLevel(source: Uint8Array | string, framesPerBucket: number): PeaksLevel {
  let header: PeaksHeader;
  let data: Buffer;
  let info: PeaksLevelInfo | undefined;
  if (typeof source === 'string') {
    const fd = openSync(source, 'r');
    try {
      const fixed = Buffer.alloc(PEAKS_HEADER_BYTES);
      readSync(fd, fixed, 0, PEAKS_HEADER_BYTES, 0);
      const tableBytes = PEAKS_HEADER_BYTES + PEAKS_LEVEL_ENTRY_BYTES * (fixed.toString('latin1', 0, 4) === PEAKS_MAGIC ? fixed.readUInt16LE(24) : 0);
      const head = Buffer.alloc(tableBytes);
      readSync(fd, head, 0, tableBytes, 0);
      header = readPeaksHeader(head);
      info = header.levels.find((l) => l.framesPerBucket === framesPerBucket);
      if (!info) throw missingLevel(header, framesPerBucket);
      const bytes = info.bucketCount * header.channels * 4;
      data = Buffer.alloc(bytes);
      const got = readSync(fd, data, 0, bytes, info.dataOffset);
      if (got < bytes) throw new Error('Peaks file is cut short inside a level.');
    } finally {
      closeSync(fd);
    }
  } else {
    header = readPeaksHeader(source);
    info = header.levels.find((l) => l.framesPerBucket === framesPerBucket);
    if (!info) throw missingLevel(header, framesPerBucket);
    const bytes = info.bucketCount * header.channels * 4;
    if (info.dataOffset + bytes > source.byteLength) throw new Error('Peaks file is cut short inside a level.');
    data = Buffer.from(source.buffer, source.byteOffset + info.dataOffset, bytes);
  }
  const { channels } = header;
  const buckets = info.bucketCount;
  const min = Array.from({ length: channels }, () => new Float32Array(buckets));
  const max = Array.from({ length: channels }, () => new Float32Array(buckets));
  for (let b = 0; b < buckets; b++) {
    for (let c = 0; c < channels; c++) {
      const o = (b * channels + c) * 4;
      min[c][b] = data.readInt16LE(o) / PEAKS_SCALE;
      max[c][b] = data.readInt16LE(o + 2) / PEAKS_SCALE;
    }
  }
  return {
    channels, sampleRate: header.sampleRate, totalFrames: header.totalFrames, durationSec: header.durationSec,
    framesPerBucket, min, max,
  };
}

/**
 * A JSON-ready shape for a waveform view that takes precomputed peaks (values
 * −1…1 per channel) and a duration: each channel's array alternates a bucket's
 * minimum and maximum, rounded to 1e-4.
 */
export function toWaveformPeaks(level: PeaksLevel): { duration: number; framesPerBucket: number; peaks: number[][] } {
  const peaks = level.min.map((mins, c) => {
    const maxs = level.max[c];
    const out = new Array<number>(2 * mins.length);
    for (let b = 0; b < mins.length; b++) {
      out[2 * b] = Math.round(mins[b] * 1e4) / 1e4;
      out[2 * b + 1] = Math.round(maxs[b] * 1e4) / 1e4;
    }
    return out;
  });
  return { duration: level.durationSec, framesPerBucket: level.framesPerBucket, peaks };
}

function missingLevel(header: PeaksHeader, framesPerBucket: number): Error {
  return new Error(
    `Peaks file has no level of ${framesPerBucket} frames per bucket (it has ${header.levels.map((l) => l.framesPerBucket).join(', ')}).`,
  );
}
