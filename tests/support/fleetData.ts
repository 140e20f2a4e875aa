import { Readable } from 'node:stream';
import { randomUUID } from 'node:crypto';
import { analyzeStream } from '@/dsp/pipeline';
import type { AnalysisReport } from '@/dsp/types';

/**
 * Test data for the fleet and spec tests: a real analysis of a generated WAV, and rows for
 * measured takes inserted straight into the test database.
 */

/**
 * A 3.5 s stereo take in a 24-bit container whose samples sit on the 16-bit grid (a recorder
 * left at 16-bit): two seconds of a chord, then a quiet passage of low noise.
 */
export function sixteenBitTakeWav(sampleRate = 48000): Buffer {
  const frames = Math.round(3.5 * sampleRate);
  const data = Buffer.alloc(frames * 2 * 3);
  let state = 12345;
  const rnd = () => {
    state ^= state << 13;
    state ^= state >>> 17;
    state ^= state << 5;
    return (state >>> 0) / 2 ** 32 - 0.5;
  };
  for (let i = 0; i < frames; i++) {
    const t = i / sampleRate;
    const loud = t < 2 ? 0.12 * (Math.sin(2 * Math.PI * 220 * t) + Math.sin(2 * Math.PI * 330 * t) + 0.5 * Math.sin(2 * Math.PI * 1250 * t)) : 0;
    for (let c = 0; c < 2; c++) {
      const x = loud + 0.0006 * rnd();
      const code16 = Math.max(-32768, Math.min(32767, Math.round(x * 32767)));
      data.writeIntLE(code16 * 256, (i * 2 + c) * 3, 3);
    }
  }
  const header = Buffer.alloc(44);
  header.write('RIFF', 0, 'latin1');
  header.writeUInt32LE(36 + data.length, 4);
  header.write('WAVEfmt ', 8, 'latin1');
  header.writeUInt32LE(16, 16);
  header.writeUInt16LE(1, 20);
  header.writeUInt16LE(2, 22);
  header.writeUInt32LE(sampleRate, 24);
  header.writeUInt32LE(sampleRate * 6, 28);
  header.writeUInt16LE(6, 32);
  header.writeUInt16LE(24, 34);
  header.write('data', 36, 'latin1');
  header.writeUInt32LE(data.length, 40);
  return Buffer.concat([header, data]);
}

/** Runs the real measurement pipeline over a WAV held in memory. */
export async function analyzeBuffer(wav: Buffer): Promise<AnalysisReport> {
  return analyzeStream(Readable.from([wav]), { totalBytes: wav.length });
}

export interface SummaryRow {
  measuredAt: Date;
  noiseFloorDbfs: number | null;
  effectiveBits?: number;
  clipEvents?: number;
  belowFullScaleClipEvents?: number;
  truePeakDbtp?: number;
  integratedLufs?: number;
  rateMismatch?: boolean;
  aliasingRisk?: boolean;
  decision?: 'pending' | 'approved' | 'rejected';
}

/** Columns of a measured take with only summary figures (as the fleet statistics read them). */
export function summaryTake(studioId: number, sessionId: number, recorderId: number, row: SummaryRow) {
  return {
    studioId,
    sessionId,
    recorderId,
    uploadedById: null,
    originalName: `fleet-test-${randomUUID().slice(0, 8)}.wav`,
    storageKey: `fleet-test/${randomUUID()}`,
    bytes: 1000,
    sha256: randomUUID().replace(/-/g, '').padEnd(64, '0'),
    sampleRate: 48000,
    bitsPerSample: 24,
    channels: 2,
    encoding: 'pcm',
    durationSec: 60,
    status: 'measured' as const,
    progress: 100,
    error: null,
    report: null,
    peaksKey: null,
    effectiveBits: row.effectiveBits ?? 22,
    truePeakDbtp: row.truePeakDbtp ?? -3,
    integratedLufs: row.integratedLufs ?? -23,
    noiseFloorDbfs: row.noiseFloorDbfs,
    clipEvents: row.clipEvents ?? 0,
    belowFullScaleClipEvents: row.belowFullScaleClipEvents ?? 0,
    rateMismatch: row.rateMismatch ?? false,
    aliasingRisk: row.aliasingRisk ?? false,
    verdict: 'pass' as const,
    decision: row.decision ?? 'pending',
    decidedById: null,
    decidedAt: null,
    decisionNote: null,
    measuredAt: row.measuredAt,
  };
}
