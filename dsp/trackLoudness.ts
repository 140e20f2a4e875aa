import { LoudnessAnalyzer, MIN_LOUDNESS_RATE_HZ, type LeftOutSpan, type LoudnessResult } from './analyzers/loudness';
import type { Analyzer, AudioFormat, SampleBlock } from './types';

/**
 * Integrated loudness of each channel on its own (BS.1770 with one channel weighted 1 and the
 * others 0), for iso tracks that are not one programme. One LoudnessAnalyzer per channel; a
 * channel weighted 0 is not filtered, so each channel is K-weighted once per analyzer.
 */
export class TrackLoudnessAnalyzer implements Analyzer<LoudnessResult[]> {
  private readonly analyzers: LoudnessAnalyzer[];

  /** @param format sample rate of at least MIN_LOUDNESS_RATE_HZ and at least one channel */
  constructor(format: AudioFormat) {
    if (!(format.sampleRate >= MIN_LOUDNESS_RATE_HZ)) throw new RangeError(`Loudness needs a sample rate of at least ${MIN_LOUDNESS_RATE_HZ} Hz, got ${format.sampleRate}`);
    this.analyzers = Array.from({ length: format.channels }, (_, channel) => {
      const weights = new Float64Array(format.channels);
      weights[channel] = 1;
      return new LoudnessAnalyzer(format, { channelWeights: weights });
    });
  }

  push(block: SampleBlock): void {
    for (const analyzer of this.analyzers) analyzer.push(block);
  }

  /** @param leaveOut a stretch left out of every track's figures (see LoudnessAnalyzer.finish) */
  finish(leaveOut: LeftOutSpan | null = null): LoudnessResult[] {
    return this.analyzers.map((analyzer) => analyzer.finish(leaveOut));
  }
}
