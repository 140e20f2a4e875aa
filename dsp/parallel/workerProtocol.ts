import type { ClippingResult } from '../analyzers/clipping';
import type { LeftOutSpan, LoudnessResult } from '../analyzers/loudness';
import type { TruePeakResult } from '../analyzers/truePeak';
import type { AudioFormat } from '../types';

/** Messages from the pipeline to the analysis worker. */
export type ToWorker =
  | { kind: 'start'; format: AudioFormat; perTrack: boolean }
  | { kind: 'block'; channels: Float64Array[]; frames: number; startFrame: number }
  | { kind: 'finish'; leaveOut: LeftOutSpan | null };

/** Messages from the analysis worker back to the pipeline. */
export type FromWorker =
  | { kind: 'ready' }
  /** A block is done; its buffers come back for reuse. */
  | { kind: 'done'; channels: Float64Array[] }
  | { kind: 'results'; truePeak: TruePeakResult; loudness: LoudnessResult; trackLoudness: LoudnessResult[] | null; clipping: ClippingResult }
  | { kind: 'failed'; message: string };
