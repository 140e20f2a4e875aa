/**
 * Shared types of the measurement engine. The report shape is a fixed contract
 * (field names and units are read by the worker, the web app and the CLI):
 * add fields freely, rename none.
 *
 * Units: levels in dBFS (RMS referenced to a full-scale square wave, so a
 * full-scale sine reads -3.01 dBFS RMS), loudness in LUFS / LU, true peak in
 * dBTP, times in seconds from the first sample, frequencies in Hz. A measure
 * that does not apply is `null`.
 */

export type Container = 'RIFF' | 'RF64';
export type Encoding = 'pcm' | 'float';
export type Severity = 'info' | 'warn' | 'fail';

/** What the header declares, plus what the reader found in the file. */
export interface AudioFormat {
  container: Container;
  encoding: Encoding;
  /** Sample rate as declared in the `fmt ` chunk, Hz. */
  sampleRate: number;
  /** Container bits per sample as declared. */
  bitsPerSample: number;
  /** Valid bits declared by WAVE_FORMAT_EXTENSIBLE, else equal to bitsPerSample. */
  validBitsPerSample: number;
  channels: number;
  /** Bytes per frame (all channels). */
  blockAlign: number;
  /** Byte offset of the first audio byte in the file. */
  dataOffset: number;
  /** Audio bytes the header declares (null when the header holds 0 or 0xFFFFFFFF). */
  declaredDataBytes: number | null;
  /** WAVE_FORMAT_EXTENSIBLE channel mask, when present. */
  channelMask: number | null;
}

/**
 * One block of decoded audio. Samples are scaled to full scale = 1.0; integer
 * codes are exact in float64, so `sample * 2^(bits-1)` recovers the code.
 */
export interface SampleBlock {
  /** One array per channel, each `frames` long (arrays may be longer; read only `frames`). */
  channels: Float64Array[];
  frames: number;
  /** Index of this block's first frame in the take. */
  startFrame: number;
}

/** Lifecycle shared by every analyzer: configure in the constructor, push blocks of any size, finish once. */
export interface Analyzer<Result> {
  push(block: SampleBlock): void;
  finish(): Result;
}

export interface BextInfo {
  description: string;
  originator: string;
  originatorReference: string;
  originationDate: string;
  originationTime: string;
  /** Sample count since midnight (64-bit in the file). */
  timeReference: number;
  codingHistory: string;
}

export type ChannelLayout = 'mono' | 'stereo' | 'surround' | 'poly';

export interface ChannelReport {
  /** The iXML track name, the loudspeaker name (L, R, C, LFE, Ls, Rs...), or null (absent in older reports). */
  name?: string | null;
  samplePeakDbfs: number | null;
  truePeakDbtp: number | null;
  /** When the channel's true peak occurs, seconds (absent in reports made before it was measured). */
  truePeakAtSec?: number;
  rmsDbfs: number | null;
  dcOffset: number;
  /** Mean of the quietest 20 % of 100 ms windows: the steady offset a converter adds, full scale = 1.0. */
  steadyDcOffset?: number;
  effectiveBits: number;
  clippedSamples: number;
  silent: boolean;
  /** Why the channel is silent: 'no-signal' (digital zero, or nothing above -90 dBFS) or 'noise-only' (steady hiss of an open input). */
  silentKind?: 'no-signal' | 'noise-only' | null;
  /** This channel's own integrated loudness (BS.1770, the channel alone), LUFS; null when unmeasurable. */
  integratedLufs?: number | null;
  /** Float samples that were NaN or ±Inf (measured as 0). */
  nonFiniteSamples?: number;
  /** Float samples beyond full scale (|x| > 1). */
  overFullScaleSamples?: number;
}

export interface ClipEvent {
  channel: number;
  startSec: number;
  endSec: number;
  level: 'fullScale' | 'belowFullScale';
  levelDbfs: number;
}

export interface Finding {
  check:
    | 'container' | 'format' | 'resolution' | 'clipping' | 'true-peak' | 'loudness'
    | 'noise-floor' | 'hum' | 'bandwidth' | 'aliasing' | 'dc-offset' | 'dropout'
    | 'silent-channel' | 'stereo' | 'tone' | 'sample-rate' | 'non-finite' | 'over-full-scale';
  severity: Severity;
  /** Plain words a producer understands. */
  message: string;
  /** The same in at most 90 characters, for one-line reasons (absent in older reports). */
  summary?: string;
  channel?: number;
  startSec?: number;
  endSec?: number;
}

export interface AnalysisReport {
  file: {
    container: Container;
    encoding: Encoding;
    sampleRate: number;
    bitsPerSample: number;
    channels: number;
    frames: number;
    durationSec: number;
    /** Valid bits declared by WAVE_FORMAT_EXTENSIBLE (else equal to bitsPerSample). */
    validBitsPerSample?: number;
    /** WAVE_FORMAT_EXTENSIBLE channel mask, when present. */
    channelMask?: number | null;
    /** Header problems the reader worked around (sizes that disagree with the bytes present...), in plain words. */
    headerIssues?: string[];
    /** One programme for loudspeakers (mono, stereo, surround) or independent iso tracks (poly). */
    layout?: ChannelLayout;
  };
  /** Float sample values that cannot be used as they are (absent in older reports). */
  samples?: {
    /** NaN or ±Inf samples, all channels; every measure treats them as 0. */
    nonFinite: number;
    firstNonFiniteSec: number | null;
    /** Float samples beyond full scale (|x| > 1), all channels. */
    overFullScale: number;
    firstOverFullScaleSec: number | null;
  };
  bext: BextInfo | null;
  /** Raw iXML text when the file carries an `iXML` chunk. */
  ixml?: string | null;
  channels: ChannelReport[];
  resolution: { effectiveBits: number; noiseLimitedBits: number | null };
  peak: { samplePeakDbfs: number | null; truePeakDbtp: number | null };
  clipping: { clippedSamples: number; events: ClipEvent[] };
  loudness: {
    integratedLufs: number | null;
    rangeLu: number | null;
    momentaryMaxLufs: number | null;
    shortTermMaxLufs: number | null;
    /**
     * Short-term (3 s) loudness every `stepSec`, for plotting; null entries below the absolute gate.
     * values[i] is the window ending at (i+1)·stepSec (the first two windows are shorter than 3 s).
     */
    shortTermSeries?: { stepSec: number; values: (number | null)[] };
    /** The stretch left out of every loudness figure (the line-up tone: `tone.startSec`/`endSec`), or null (absent in older reports). */
    leftOut?: { startSec: number; endSec: number } | null;
  };
  noise: {
    /** Floor of the noisiest channel under the programme, dBFS; of a poly take, of its quietest track. */
    floorDbfs: number | null;
    humHz: 50 | 60 | null;
    /**
     * What the floor stands on: 'quiet-passages' under the programme, 'steady-noise' (a take of room tone or hiss),
     * or 'none': no quiet passage (dense material, a steady loud sound, digital silence), so neither floor nor hum
     * was measured (absent in older reports).
     */
    basis?: 'quiet-passages' | 'steady-noise' | 'none';
    /** Signal-to-noise ratio: the programme's RMS over the floor's, dB; null without quiet passages under a programme, and for a poly take (absent in older reports). */
    snrDb?: number | null;
  };
  bandwidth: {
    effectiveHz: number | null;
    impliedSourceRate: number | null;
    nearNyquistDb: number | null;
    aliasingRisk: boolean;
    /** Frequency of the strongest line in the long-term spectrum above 20 Hz, Hz. */
    peakHz?: number | null;
    /** Long-term average spectrum, a few hundred log-spaced points, dB relative to the passband. */
    spectrum?: { hz: number[]; db: number[] };
  };
  dropouts: { startSec: number; endSec: number }[];
  /** Dropouts found, including any beyond those listed. */
  dropoutCount?: number;
  /** The take falls to digital silence in its own pauses (gated, edited, synthesised), so gaps are not judged as dropouts. */
  silentPauses?: boolean;
  stereo: {
    correlation: number;
    identicalChannels: boolean;
    polarityInverted: boolean;
    /** Share of audible 400 ms windows whose correlation is below -0.3. */
    antiPhaseShare?: number;
    /** 5 s segments whose delay-tolerant comparison found the channels in the same / opposite polarity. */
    inPolaritySegments?: number;
    invertedSegments?: number;
    /** Span of the segments in opposite polarity, seconds (null when none). */
    invertedFromSec?: number | null;
    invertedToSec?: number | null;
  } | null;
  tone: {
    startSec: number;
    endSec: number;
    frequencyHz: number;
    levelDbfs: number;
    sinadDb: number;
    thdnDb: number;
    enobBits: number;
    /** SINAD and ENOB are the limit of the container's quantisation, not a measurement: the real values are at least these (absent in older reports). */
    limitedByContainer?: boolean;
    likelyRecordedRate: number | null;
    /** Channel the tone was measured on (the strongest), 0-based. */
    channel?: number;
  } | null;
  /** The waveform peaks file written for the review screen, or null when none was asked for. */
  waveform?: {
    path: string;
    channels: number;
    sampleRate: number;
    frames: number;
    levels: { framesPerBucket: number; buckets: number }[];
  } | null;
  findings: Finding[];
}
