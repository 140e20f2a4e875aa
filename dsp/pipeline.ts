import { createReadStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import type { Readable } from 'node:stream';
import { ClippingAnalyzer, type ClippingResult } from './analyzers/clipping';
import { DropoutAnalyzer, type DropoutResult } from './analyzers/dropouts';
import { LevelsAnalyzer, type LevelsResult } from './analyzers/levels';
import { LoudnessAnalyzer, MIN_LOUDNESS_RATE_HZ, UNMEASURED_LOUDNESS, type LoudnessResult } from './analyzers/loudness';
import { NoiseFloorAnalyzer, type NoiseFloorResult } from './analyzers/noiseFloor';
import { SpectrumAnalyzer, type BandwidthResult } from './analyzers/spectrum';
import { StereoAnalyzer, type StereoResult } from './analyzers/stereo';
import { ToneAnalyzer, type ToneResult } from './analyzers/tone';
import { TruePeakAnalyzer, type TruePeakResult } from './analyzers/truePeak';
import { WaveformPeaksAnalyzer, type WaveformPeaksResult } from './analyzers/waveformPeaks';
import { judgeReport } from './findings';
import { channelLayout } from './layout';
import { TrackLoudnessAnalyzer } from './trackLoudness';
import { WorkerAnalyzers } from './parallel/WorkerAnalyzers';
import { openWav, type NonFiniteSamples, type OpenedWav, type WavMetadata } from './reader/wavReader';
import { DEFAULT_SPEC, type DeliverySpec } from './spec';
import type { AnalysisReport, Analyzer, AudioFormat } from './types';
import { amplitudeToDb, powerToDb, roundOrNull, roundTo } from './util/decibels';

export interface AnalyzeOptions {
  /** Size of the file in bytes, for progress; unknown when omitted. */
  totalBytes?: number;
  /** Delivery spec the findings are judged against (default DEFAULT_SPEC). */
  spec?: DeliverySpec;
  /**
   * Called with bytes read so far and the total (null when unknown), at most
   * every PROGRESS_INTERVAL_MS while reading, and once more with done = total
   * when the whole file has been read (before the final computations and findings).
   */
  onProgress?: (doneBytes: number, totalBytes: number | null) => void;
  /** Where to write the waveform peaks file; no peaks file without it. */
  peaksPath?: string;
  /** Opens the same file again from an offset (lets a file whose audio precedes its fmt chunk be read). */
  reopenAt?: (byteOffset: number) => Readable;
  /**
   * Run true peak, loudness and clipping on a second thread (default true; used
   * only for takes of PARALLEL_MIN_BYTES or more, and only when a worker thread
   * can start here, else everything runs on the calling thread with the same results).
   */
  parallel?: boolean;
}

/** Takes smaller than this are analysed on one thread: starting a worker costs more than it saves. */
export const PARALLEL_MIN_BYTES = 32 * 1024 * 1024;

/** Shortest gap between two progress callbacks, ms. */
export const PROGRESS_INTERVAL_MS = 250;

const dbOrNull = (amplitude: number, decimals = 3) => roundOrNull(amplitudeToDb(amplitude), decimals);

/**
 * Measures a WAV take from a stream in one read and returns the full report,
 * findings judged against `options.spec`.
 * @throws UnreadableWavError when the stream is not a WAV Takeproof can read
 */
export async function analyzeStream(readable: Readable, options: AnalyzeOptions = {}): Promise<AnalysisReport> {
  const spec = options.spec ?? DEFAULT_SPEC;
  let wav: OpenedWav;
  try {
    wav = await openWav(readable, { reopenAt: options.reopenAt });
  } catch (error) {
    readable.destroy();
    throw error;
  }
  const { format } = wav;

  const audioBytes = format.declaredDataBytes ?? (options.totalBytes ?? 0) - format.dataOffset;
  const perTrack = mayBeIsoTracks(format, wav.metadata);
  const remote = options.parallel !== false && audioBytes >= PARALLEL_MIN_BYTES ? await WorkerAnalyzers.start(format, perTrack) : null;
  const levels = new LevelsAnalyzer(format);
  const dropouts = new DropoutAnalyzer(format);
  const stereo = format.channels === 2 ? new StereoAnalyzer(format) : null;
  const spectrum = new SpectrumAnalyzer(format);
  const noise = new NoiseFloorAnalyzer(format);
  const tone = new ToneAnalyzer(format);
  const peaks = options.peaksPath ? new WaveformPeaksAnalyzer(format, { outputPath: options.peaksPath }) : null;
  const truePeak = remote ? null : new TruePeakAnalyzer(format);
  const loudness = remote || format.sampleRate < MIN_LOUDNESS_RATE_HZ ? null : new LoudnessAnalyzer(format);
  const clipping = remote ? null : new ClippingAnalyzer(format);
  const trackLoudness = remote || !perTrack || format.sampleRate < MIN_LOUDNESS_RATE_HZ ? null : new TrackLoudnessAnalyzer(format);
  const local: Analyzer<unknown>[] = [levels, dropouts, spectrum, noise, tone];
  for (const analyzer of [stereo, peaks, truePeak, loudness, clipping, trackLoudness]) if (analyzer) local.push(analyzer);

  const totalBytes = options.totalBytes ?? null;
  let lastProgressAt = 0;
  try {
    for await (const block of wav.blocks()) {
      if (remote) await remote.push(block);
      for (const analyzer of local) analyzer.push(block);
      if (options.onProgress) {
        const now = Date.now();
        if (now - lastProgressAt >= PROGRESS_INTERVAL_MS) {
          lastProgressAt = now;
          options.onProgress(wav.bytesRead(), totalBytes);
        }
      }
    }
  } catch (error) {
    await remote?.terminate();
    throw error;
  }
  const bytesDone = totalBytes ?? wav.bytesRead();
  options.onProgress?.(bytesDone, bytesDone);
  // The line-up tone is not programme: loudness is measured without it (EBU R 128 measures the programme).
  const lineUpTone = tone.finish();
  const leaveOut = lineUpTone ? { startSec: lineUpTone.startSec, endSec: lineUpTone.endSec } : null;
  const remoteResults = remote ? await remote.finish(leaveOut) : null;

  const measurements: Measurements = {
    levels: levels.finish(),
    clipping: remoteResults?.clipping ?? clipping!.finish(),
    truePeak: remoteResults?.truePeak ?? truePeak!.finish(),
    loudness: remoteResults?.loudness ?? loudness?.finish(leaveOut) ?? UNMEASURED_LOUDNESS,
    trackLoudness: remoteResults ? remoteResults.trackLoudness : (trackLoudness?.finish(leaveOut) ?? null),
    nonFinite: wav.nonFiniteSamples(),
    dropouts: dropouts.finish(),
    stereo: stereo?.finish() ?? null,
    bandwidth: spectrum.finish(),
    // Iso tracks are judged by the quietest track; the layout is known once the whole file is read (iXML may follow the audio).
    noise: noise.finish({ isoTracks: channelLayout(format.channels, format.channelMask, wav.metadata.ixml).layout === 'poly' }),
    tone: lineUpTone,
    waveform: peaks?.finish() ?? null,
  };
  const report = assembleReport(format, wav.metadata, wav.framesRead(), measurements);
  report.findings = judgeReport(report, spec);
  return report;
}

/**
 * Whether each channel's own loudness is needed: iso tracks, known from an iXML track list before the
 * audio, or possible whenever more than two channels come without a loudspeaker mask (an iXML chunk
 * after the audio may still declare them tracks). Not for mono, plain stereo or declared surround.
 */
function mayBeIsoTracks(format: AudioFormat, metadata: WavMetadata): boolean {
  if (format.channels < 2) return false;
  if (channelLayout(format.channels, format.channelMask, metadata.ixml).layout === 'poly') return true;
  return format.channels > 2 && !format.channelMask;
}

/** What the analyzers found, before it is shaped into the report. */
interface Measurements {
  levels: LevelsResult;
  clipping: ClippingResult;
  truePeak: TruePeakResult;
  loudness: LoudnessResult;
  /** Each channel's own loudness (multichannel takes only). */
  trackLoudness: LoudnessResult[] | null;
  nonFinite: NonFiniteSamples;
  dropouts: DropoutResult;
  stereo: StereoResult | null;
  bandwidth: BandwidthResult;
  noise: NoiseFloorResult;
  tone: ToneResult | null;
  waveform: WaveformPeaksResult | null;
}

/** Shapes the measurements into the report contract (levels in dB, rounded; findings left empty). */
function assembleReport(format: AudioFormat, metadata: WavMetadata, frames: number, m: Measurements): AnalysisReport {
  const { layout, names } = channelLayout(format.channels, format.channelMask, metadata.ixml);
  const wholeLoudness = layout === 'poly' ? UNMEASURED_LOUDNESS : m.loudness;
  const channelLoudness = (index: number) => (format.channels === 1 ? m.loudness : m.trackLoudness?.[index] ?? null)?.integratedLufs ?? null;
  const seconds = (frame: number | null) => (frame === null ? null : roundTo(frame / format.sampleRate, 4));
  const overFullScaleFrames = m.levels.channels.map((channel) => channel.firstOverFullScaleFrame).filter((frame): frame is number => frame !== null);
  const channels = m.levels.channels.map((channel, index) => ({
    name: names[index],
    samplePeakDbfs: dbOrNull(channel.samplePeak),
    truePeakDbtp: dbOrNull(m.truePeak.channelTruePeaks[index]),
    truePeakAtSec: roundTo(m.truePeak.channelTruePeakFrames[index] / format.sampleRate, 4),
    // Mean square re a full-scale square wave: a full-scale sine reads -3.01 dBFS.
    rmsDbfs: roundOrNull(powerToDb(channel.meanSquare), 3),
    dcOffset: channel.dcOffset,
    steadyDcOffset: channel.steadyDcOffset,
    effectiveBits: channel.effectiveBits,
    clippedSamples: m.clipping.channelClippedSamples[index],
    silent: channel.silent,
    silentKind: channel.silentKind,
    integratedLufs: roundOrNull(channelLoudness(index), 3),
    nonFiniteSamples: m.nonFinite.perChannel[index],
    overFullScaleSamples: channel.overFullScaleSamples,
  }));
  return {
    file: {
      container: format.container,
      encoding: format.encoding,
      sampleRate: format.sampleRate,
      bitsPerSample: format.bitsPerSample,
      validBitsPerSample: format.validBitsPerSample,
      channels: format.channels,
      channelMask: format.channelMask,
      frames,
      durationSec: frames / format.sampleRate,
      headerIssues: metadata.headerIssues,
      layout,
    },
    samples: {
      nonFinite: m.nonFinite.perChannel.reduce((sum, count) => sum + count, 0),
      firstNonFiniteSec: seconds(m.nonFinite.firstFrame),
      overFullScale: m.levels.channels.reduce((sum, channel) => sum + channel.overFullScaleSamples, 0),
      firstOverFullScaleSec: seconds(overFullScaleFrames.length > 0 ? Math.min(...overFullScaleFrames) : null),
    },
    bext: metadata.bext,
    ixml: metadata.ixml,
    channels,
    resolution: {
      effectiveBits: Math.max(0, ...m.levels.channels.map((channel) => channel.effectiveBits)),
      noiseLimitedBits: m.noise.noiseLimitedBits,
    },
    peak: {
      samplePeakDbfs: dbOrNull(Math.max(...m.levels.channels.map((channel) => channel.samplePeak))),
      truePeakDbtp: dbOrNull(Math.max(...m.truePeak.channelTruePeaks)),
    },
    clipping: { clippedSamples: m.clipping.clippedSamples, events: m.clipping.events },
    // Iso tracks are not one programme: their loudness is per track only.
    loudness: {
      integratedLufs: roundOrNull(wholeLoudness.integratedLufs, 3),
      rangeLu: roundOrNull(wholeLoudness.rangeLu, 3),
      momentaryMaxLufs: roundOrNull(wholeLoudness.momentaryMaxLufs, 3),
      shortTermMaxLufs: roundOrNull(wholeLoudness.shortTermMaxLufs, 3),
      shortTermSeries: wholeLoudness.shortTermSeries,
      leftOut: m.tone ? { startSec: m.tone.startSec, endSec: m.tone.endSec } : null,
    },
    noise: { floorDbfs: m.noise.floorDbfs, humHz: m.noise.humHz, basis: m.noise.basis, snrDb: m.noise.snrDb },
    bandwidth: {
      effectiveHz: m.bandwidth.effectiveHz,
      impliedSourceRate: m.bandwidth.impliedSourceRate,
      nearNyquistDb: m.bandwidth.nearNyquistDb,
      aliasingRisk: m.bandwidth.aliasingRisk,
      peakHz: m.bandwidth.peakHz,
      spectrum: m.bandwidth.spectrum,
    },
    dropouts: m.dropouts.dropouts,
    dropoutCount: m.dropouts.dropoutCount,
    silentPauses: m.dropouts.silentPauses,
    stereo: m.stereo && layout !== 'poly' ? {
      correlation: roundTo(m.stereo.correlation, 4),
      identicalChannels: m.stereo.identicalChannels,
      polarityInverted: m.stereo.polarityInverted,
      antiPhaseShare: roundTo(m.stereo.antiPhaseShare, 4),
      inPolaritySegments: m.stereo.polarity.inPolaritySegments,
      invertedSegments: m.stereo.polarity.invertedSegments,
      invertedFromSec: m.stereo.polarity.invertedFromSec,
      invertedToSec: m.stereo.polarity.invertedToSec,
    } : null,
    tone: m.tone,
    waveform: m.waveform,
    findings: [],
  };
}

/**
 * Measures a WAV file on disk; see analyzeStream.
 * @param path file path
 * @throws UnreadableWavError when the file is not a WAV Takeproof can read; fs errors (ENOENT...) as they are
 */
export async function analyzeFile(path: string, options: AnalyzeOptions = {}): Promise<AnalysisReport> {
  const { size } = await stat(path);
  return analyzeStream(createReadStream(path, { highWaterMark: 1024 * 1024 }), {
    ...options,
    totalBytes: options.totalBytes ?? size,
    reopenAt: options.reopenAt ?? ((byteOffset) => createReadStream(path, { start: byteOffset, highWaterMark: 1024 * 1024 })),
  });
}
