import { Readable } from 'node:stream';
import { randomUUID } from 'node:crypto';
import { analyzeStream } from '@/dsp/pipeline';
import type { AnalysisReport } from '@/dsp/types';
import { seededRandom } from './testSignals';
import { encodeSamples, wavFile } from './wavWriter';

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
  const random = seededRandom(12345);
  const audio = [new Float64Array(frames), new Float64Array(frames)];
  for (let i = 0; i < frames; i++) {
    const t = i / sampleRate;
    const loud = t < 2 ? 0.12 * (Math.sin(2 * Math.PI * 220 * t) + Math.sin(2 * Math.PI * 330 * t) + 0.5 * Math.sin(2 * Math.PI * 1250 * t)) : 0;
    for (const channel of audio) {
      const x = loud + 0.0006 * (random() - 0.5);
      // On the 16-bit grid: the 24-bit container's lowest 8 bits stay zero.
      channel[i] = Math.max(-32768, Math.min(32767, Math.round(x * 32767))) / 32768;
    }
  }
  return wavFile({ sampleRate, channels: 2, coding: 'pcm24' }, encodeSamples(audio, 'pcm24'));
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
