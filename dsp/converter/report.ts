/**
 * The converter check report (contract). Levels are dB FS with a full-scale SINE at 0 dB FS
 * (AES17 convention); take reports use a different reference (RMS re a full-scale square wave, a
 * full-scale sine reading −3.01 dB FS RMS), so the two must not be compared without 3.01 dB.
 * Frequencies in Hz, times in seconds, delays in samples at the recording's rate. A measure that
 * cannot be made (a dead channel, a single channel, digital silence) is null.
 */

export type ConverterSeverity = 'info' | 'warn' | 'fail';

export type ConverterCheckName =
  | 'signal'
  | 'overload'
  | 'dead-channel'
  | 'polarity'
  | 'clock'
  | 'gain'
  | 'channel-balance'
  | 'delay'
  | 'distortion'
  | 'resolution'
  | 'dynamic-range'
  | 'noise'
  | 'response'
  | 'band-edge'
  | 'crosstalk'
  | 'baseline';

export interface ConverterFinding {
  check: ConverterCheckName;
  severity: ConverterSeverity;
  /** What the value was judged against: a threshold, the recorder's baseline, or how the check was made. */
  basis: 'threshold' | 'baseline' | 'check';
  /** One or two sentences in plain words. */
  message: string;
  /** 0-based channel, when the finding concerns one channel. */
  channel?: number;
  /** The measured value and what it was compared with (units as in the report field). */
  value?: number | null;
  reference?: number | null;
}

export interface ThdnPair {
  /** THD+N of the −1 dB FS tone, dB relative to the fundamental, 20 Hz–20 kHz (or Nyquist). */
  minus1: number | null;
  /** The same for the −20 dB FS tone. */
  minus20: number | null;
}

export interface ConverterChannelReport {
  /** True when the channel carries no trace of the check signal (tone below −60 dB FS). */
  dead: boolean;
  /** Samples at full scale within the check signal: the signal was played too loud (or the input clips). */
  clippedSamples: number;
  /** Recorded level of the −1 dB FS tone minus −1, dB. */
  gainDb: number | null;
  polarityInverted: boolean | null;
  thdnDb: ThdnPair;
  /** IEEE 1241 SINAD of the −1 dB FS tone referred to full scale: full-scale sine power / noise-and-distortion power (DC excluded, up to Nyquist), dB. */
  sinadDb: number | null;
  /** IEEE 1241 effective number of bits: (sinadDb − 1.76) / 6.02. */
  enobBits: number | null;
  /** AES17 dynamic range: full scale over the noise and distortion present with the −60 dB FS tone, 20 Hz–20 kHz, dB (= 60 + |THD+N| at unity gain). */
  dynamicRangeDb: number | null;
  /** The same, A-weighted (IEC 61672). */
  dynamicRangeDbA: number | null;
  /** Idle noise (digital silence played), 20 Hz–20 kHz, dB FS; null when the recording is digital zero. */
  noiseFloorDbfs: number | null;
  /** The same, A-weighted (IEC 61672). */
  noiseFloorDbfsA: number | null;
  /** The same, unweighted over the whole band up to Nyquist. */
  noiseFloorFullBandDbfs: number | null;
  /** Level at each multitone frequency relative to the tone nearest 997 Hz, dB. */
  frequencyResponse: { hz: number[]; db: number[] } | null;
  /** Largest |deviation| of the response from 20 Hz to 20 kHz or 0.45 × the rate, whichever is lower, dB. */
  passbandDeviationDb: number | null;
  /** Upper −3 dB point, Hz; null when the response stays above −3 dB up to the highest tone (0.495 × the rate). */
  bandEdgeHz: number | null;
  /** Delay against channel 1, whole samples (positive: this channel is later); 0 for channel 1. */
  delaySamples: number | null;
  /** Worst leakage into this channel when another channel is driven alone, dB relative to the driven channel. */
  crosstalkIntoDb: number | null;
}

export interface CrosstalkPath {
  /** 0-based channel driven alone. */
  driven: number;
  /** 0-based channel the leakage is measured in. */
  into: number;
  /** Leakage at each crosstalk tone, dB relative to the driven channel (same order as `crosstalkTonesHz`), floored at −200 dB. */
  db: number[];
}

export interface ConverterReport {
  kind: 'converter-check';
  /** Version of the check signal's design the recording was analysed against. */
  signalVersion: number;
  /** How levels are referred, in words (AES17: full-scale sine = 0 dB FS). */
  levelReference: string;
  file: {
    container: 'RIFF' | 'RF64';
    encoding: 'pcm' | 'float';
    sampleRate: number;
    bitsPerSample: number;
    channels: number;
    frames: number;
    durationSec: number;
  };
  /** Where the check signal was found in the recording. */
  signal: {
    startSec: number;
    endSec: number;
    /** Normalised correlation of the start and end markers, 0–1 (1 = exact match). */
    markerMatch: number;
    /** Sample rate and bit depth the signal was written at (read from its format section); null when unreadable. */
    writtenSampleRate: number | null;
    writtenBits: number | null;
  };
  /** Frequency error of the recorded tones against the signal as written, ppm; positive when they read higher (the recorder's clock runs slow against the player's). */
  clockErrorPpm: number | null;
  channels: ConverterChannelReport[];
  /** Worst leakage into an undriven channel, dB relative to the driven one; null for one channel. */
  crosstalkDb: number | null;
  crosstalkTonesHz: number[];
  crosstalkPaths: CrosstalkPath[];
  /** Largest gain difference between live channels, dB (≥ 0); null for fewer than two. */
  channelGainMismatchDb: number | null;
  /** Channel 2 against channel 1, whole samples, signed (positive: channel 2 is later); with more channels, the largest in size of them all against channel 1. */
  interChannelDelaySamples: number | null;
  /** Measurement bands, Hz: THD+N and dynamic range, idle noise, passband deviation, the multitone's span; and how SINAD is banded. */
  bands: { thdnHz: [number, number]; noiseHz: [number, number]; passbandHz: [number, number]; responseHz: [number, number]; sinad: string };
  findings: ConverterFinding[];
}
