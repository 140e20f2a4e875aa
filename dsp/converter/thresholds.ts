import { z } from 'zod';

/**
 * What a converter check is judged against, editable per recorder model. Every default is a
 * Takeproof starting point marked [common practice] (no standard sets pass/fail limits for
 * converters); the studio's own specifications take precedence.
 */
export const converterThresholdsSchema = z.object({
  // Limits: a value beyond one is a finding whatever the recorder's history.
  /** Largest clock error between player and recorder, ppm (a warning: the player's clock counts too). */
  maxClockErrorPpm: z.number().min(1).max(5000),
  /** Largest gain error of a channel at 997 Hz, ± dB. */
  maxGainErrorDb: z.number().min(0.01).max(40),
  /** Largest gain difference between channels, dB. */
  maxChannelGainMismatchDb: z.number().min(0.01).max(20),
  /** Highest THD+N of the −1 dB FS tone, dB. */
  maxThdnDb: z.number().min(-160).max(0),
  /** Fewest effective bits (IEEE 1241) at −1 dB FS. */
  minEnobBits: z.number().min(1).max(32),
  /** Lowest AES17 dynamic range (unweighted), dB. */
  minDynamicRangeDb: z.number().min(20).max(200),
  /** Highest idle noise (unweighted, 20 Hz–20 kHz), dB FS. */
  maxNoiseFloorDbfs: z.number().min(-200).max(-20),
  /** Largest passband deviation, ± dB. */
  maxPassbandDeviationDb: z.number().min(0.01).max(20),
  /** Lowest upper −3 dB point, Hz (capped at 0.45 × the sample rate for low rates). */
  minBandEdgeHz: z.number().min(1000).max(100_000),
  /** Highest crosstalk, dB relative to the driven channel. */
  maxCrosstalkDb: z.number().min(-200).max(0),
  /** Largest delay between channels, samples (a warning). */
  maxInterChannelDelaySamples: z.number().int().min(0).max(10_000),
  // Drift: a change against the recorder's baseline (its first accepted check) raises a warning.
  noiseRiseDb: z.number().min(0.1).max(60),
  enobDropBits: z.number().min(0.05).max(16),
  dynamicRangeDropDb: z.number().min(0.1).max(60),
  thdnRiseDb: z.number().min(0.1).max(60),
  gainDriftDb: z.number().min(0.01).max(20),
  /** Move of the upper −3 dB point, % of the baseline's. */
  bandEdgeShiftPercent: z.number().min(0.1).max(50),
  crosstalkRiseDb: z.number().min(0.1).max(60),
  clockDriftPpm: z.number().min(0.1).max(5000),
});

export type ConverterThresholds = z.infer<typeof converterThresholdsSchema>;

export const DEFAULT_CONVERTER_THRESHOLDS: ConverterThresholds = {
  maxClockErrorPpm: 50, // [common practice] ordinary crystal clocks: ±20–50 ppm at each end
  maxGainErrorDb: 1, // [common practice]
  maxChannelGainMismatchDb: 0.3, // [common practice]
  maxThdnDb: -80, // [common practice] studio converters at −1 dB FS
  minEnobBits: 13, // [common practice] in step with maxThdnDb: −80 dB at −1 dB FS is about 13 effective bits
  minDynamicRangeDb: 90, // [common practice] leaves room for 16-bit recorders (94.1 dB with TPDF dither, 20 Hz–20 kHz)
  maxNoiseFloorDbfs: -90, // [common practice]
  maxPassbandDeviationDb: 0.5, // [common practice]
  minBandEdgeHz: 20_000, // [common practice] the AES17 audio band
  maxCrosstalkDb: -80, // [common practice]
  maxInterChannelDelaySamples: 0, // [common practice] a converter samples its channels together
  noiseRiseDb: 3, // [common practice]
  enobDropBits: 0.5, // [common practice]
  dynamicRangeDropDb: 3, // [common practice]
  thdnRiseDb: 6, // [common practice]
  gainDriftDb: 0.5, // [common practice]
  bandEdgeShiftPercent: 2, // [common practice]
  crosstalkRiseDb: 6, // [common practice]
  clockDriftPpm: 20, // [common practice]
};
