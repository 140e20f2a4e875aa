import type { Analyzer, AudioFormat, SampleBlock } from '../../dsp/types';

/** A format record for feeding analyzers directly (no file). */
export function formatOf(sampleRate: number, channels: number, overrides: Partial<AudioFormat> = {}): AudioFormat {
  return {
    container: 'RIFF',
    encoding: 'float',
    sampleRate,
    bitsPerSample: 64,
    validBitsPerSample: 64,
    channels,
    blockAlign: channels * 8,
    dataOffset: 44,
    declaredDataBytes: null,
    channelMask: null,
    ...overrides,
  };
}

/**
 * Pushes whole signals through an analyzer in blocks of uneven sizes (cycling
 * through `blockSizes`), copying each block as the reader would, then finishes it.
 */
export function runAnalyzer<R>(analyzer: Analyzer<R>, channels: Float64Array[], blockSizes: number[] = [65536, 4097, 31, 1000]): R {
  const frames = channels[0].length;
  let start = 0;
  let turn = 0;
  while (start < frames) {
    const size = Math.min(blockSizes[turn++ % blockSizes.length], frames - start);
    const block: SampleBlock = { channels: channels.map((channel) => channel.slice(start, start + size)), frames: size, startFrame: start };
    analyzer.push(block);
    start += size;
  }
  return analyzer.finish();
}
