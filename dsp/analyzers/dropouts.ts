import type { Analyzer, AudioFormat, SampleBlock } from '../types';

/** Shortest digital-silence gap reported as a dropout, seconds [common practice: 1-10 ms]. */
export const DEFAULT_MIN_DROPOUT_SEC = 0.005;
/**
 * Material that falls to digital silence in its own pauses (gated, edited or synthesised speech) has
 * gaps a dropout cannot be told from: at least this many gaps, making up this share of the take, one
 * of them at least this long (a pause, not a glitch) [common practice].
 */
const SILENT_PAUSES_MIN_GAPS = 5;
const SILENT_PAUSES_MIN_SHARE = 0.02;
const SILENT_PAUSES_MIN_LONGEST_SEC = 0.15;
/** Dropouts kept in the report; more are counted but not listed. */
const MAX_LISTED_DROPOUTS = 10_000;

export interface DropoutResult {
  dropouts: { startSec: number; endSec: number }[];
  /** All dropouts found, including those beyond the listed ones. */
  dropoutCount: number;
  /** The take falls to digital silence in its own pauses, so its gaps cannot be judged as dropouts. */
  silentPauses: boolean;
}

/**
 * Dropouts: runs of exact digital zero on every channel at once, at least
 * `minDurationSec` long, with signal before and after (silence at the head or
 * tail of a take is not a dropout).
 */
export class DropoutAnalyzer implements Analyzer<DropoutResult> {
  private readonly sampleRate: number;
  private readonly channelCount: number;
  private readonly minFrames: number;
  /** First frame of the current all-zero run, or -1 when the last frame carried signal. */
  private zeroRunStart = -1;
  private signalSeen = false;
  private readonly found: { startSec: number; endSec: number }[] = [];
  private count = 0;
  private gapFrames = 0;
  private longestGapFrames = 0;
  private frames = 0;

  /**
   * @param format sample rate and channel count
   * @param options.minDurationSec shortest gap to report, seconds (default 0.005)
   */
  constructor(format: AudioFormat, options: { minDurationSec?: number } = {}) {
    const minDurationSec = options.minDurationSec ?? DEFAULT_MIN_DROPOUT_SEC;
    if (!(minDurationSec > 0)) throw new RangeError('The shortest dropout must be longer than 0 s');
    this.sampleRate = format.sampleRate;
    this.channelCount = format.channels;
    // Whole samples, rounded down: 5 ms at 44.1 kHz is 220.5 samples, and a 220-sample gap is a 5 ms dropout.
    this.minFrames = Math.max(1, Math.floor(minDurationSec * format.sampleRate + 1e-6));
  }

  push(block: SampleBlock): void {
    const frames = block.frames;
    const first = block.channels[0];
    const others = block.channels.slice(1, this.channelCount);
    for (let i = 0; i < frames; i++) {
      // Most frames carry signal on the first channel: test the others only when it is zero.
      let zero = first[i] === 0;
      for (let c = 0; zero && c < others.length; c++) zero = others[c][i] === 0;
      if (zero) {
        if (this.zeroRunStart < 0) this.zeroRunStart = block.startFrame + i;
        continue;
      }
      if (this.zeroRunStart >= 0) {
        const frame = block.startFrame + i;
        if (this.signalSeen && frame - this.zeroRunStart >= this.minFrames) this.record(this.zeroRunStart, frame);
        this.zeroRunStart = -1;
      }
      this.signalSeen = true;
    }
    this.frames += frames;
  }

  private record(startFrame: number, endFrame: number): void {
    this.count++;
    this.gapFrames += endFrame - startFrame;
    this.longestGapFrames = Math.max(this.longestGapFrames, endFrame - startFrame);
    if (this.found.length < MAX_LISTED_DROPOUTS) {
      this.found.push({ startSec: startFrame / this.sampleRate, endSec: endFrame / this.sampleRate });
    }
  }

  finish(): DropoutResult {
    const silentPauses =
      this.count >= SILENT_PAUSES_MIN_GAPS &&
      this.gapFrames >= SILENT_PAUSES_MIN_SHARE * this.frames &&
      this.longestGapFrames >= SILENT_PAUSES_MIN_LONGEST_SEC * this.sampleRate;
    return { dropouts: this.found, dropoutCount: this.count, silentPauses };
  }
}
