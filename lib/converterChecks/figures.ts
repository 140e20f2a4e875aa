import type { ConverterChannelReport, ConverterReport } from '@/dsp/converter/report';
import type { ConverterThresholds } from '@/dsp/converter/thresholds';

/** One measure of a converter check as the result page's table shows it: per channel, beside the baseline and the limit. */
export interface FigureRow {
  label: string;
  unit: string;
  decimals: number;
  values: (number | null)[];
  /** The baseline check's values (same channels), or null without a comparable baseline. */
  baseline: (number | null)[] | null;
  /** The threshold in words ("at most −80"), or null when the measure has none. */
  limit: string | null;
}

type ChannelMeasure = { label: string; unit: string; decimals: number; read: (c: ConverterChannelReport) => number | null; limit?: (t: ConverterThresholds, rate: number) => string };

const CHANNEL_MEASURES: ChannelMeasure[] = [
  { label: 'Gain at 997 Hz', unit: 'dB', decimals: 2, read: (c) => c.gainDb, limit: (t) => `within ±${t.maxGainErrorDb}` },
  { label: 'THD+N at −1 dB FS', unit: 'dB', decimals: 1, read: (c) => c.thdnDb.minus1, limit: (t) => `at most ${t.maxThdnDb}` },
  { label: 'THD+N at −20 dB FS', unit: 'dB', decimals: 1, read: (c) => c.thdnDb.minus20 },
  { label: 'SINAD at −1 dB FS', unit: 'dB', decimals: 1, read: (c) => c.sinadDb },
  { label: 'Effective bits (ENOB)', unit: 'bits', decimals: 2, read: (c) => c.enobBits, limit: (t) => `at least ${t.minEnobBits}` },
  { label: 'Dynamic range', unit: 'dB', decimals: 1, read: (c) => c.dynamicRangeDb, limit: (t) => `at least ${t.minDynamicRangeDb}` },
  { label: 'Dynamic range, A-weighted', unit: 'dB', decimals: 1, read: (c) => c.dynamicRangeDbA },
  { label: 'Idle noise', unit: 'dB FS', decimals: 1, read: (c) => c.noiseFloorDbfs, limit: (t) => `at most ${t.maxNoiseFloorDbfs}` },
  { label: 'Idle noise, A-weighted', unit: 'dB FS', decimals: 1, read: (c) => c.noiseFloorDbfsA },
  { label: 'Passband deviation', unit: '± dB', decimals: 2, read: (c) => c.passbandDeviationDb, limit: (t) => `at most ${t.maxPassbandDeviationDb}` },
  { label: 'Upper −3 dB point', unit: 'Hz', decimals: 0, read: (c) => c.bandEdgeHz, limit: (t, rate) => `at least ${Math.round(Math.min(t.minBandEdgeHz, 0.45 * rate))}` },
  { label: 'Delay against channel 1', unit: 'samples', decimals: 0, read: (c) => c.delaySamples, limit: (t) => `at most ${t.maxInterChannelDelaySamples}` },
  { label: 'Crosstalk into this channel', unit: 'dB', decimals: 1, read: (c) => c.crosstalkIntoDb, limit: (t) => `at most ${t.maxCrosstalkDb}` },
];

/** Whether a baseline can be compared with a check: same rate and channel count (the engine's rule too). */
export function comparable(report: ConverterReport, baseline: ConverterReport | null): baseline is ConverterReport {
  return !!baseline && baseline.file.sampleRate === report.file.sampleRate && baseline.channels.length === report.channels.length;
}

/** The per-channel figures of a check, with the baseline's beside them when comparable. */
export function channelFigures(report: ConverterReport, baseline: ConverterReport | null, thresholds: ConverterThresholds): FigureRow[] {
  const base = comparable(report, baseline) ? baseline : null;
  return CHANNEL_MEASURES.map((m) => ({
    label: m.label,
    unit: m.unit,
    decimals: m.decimals,
    values: report.channels.map(m.read),
    baseline: base ? base.channels.map(m.read) : null,
    limit: m.limit ? m.limit(thresholds, report.file.sampleRate) : null,
  }));
}

/** The figures of the check as a whole (clock, balance, crosstalk, delay). */
export function wholeCheckFigures(report: ConverterReport, baseline: ConverterReport | null, thresholds: ConverterThresholds): FigureRow[] {
  const base = comparable(report, baseline) ? baseline : null;
  const row = (label: string, unit: string, decimals: number, read: (r: ConverterReport) => number | null, limit: string | null): FigureRow => ({
    label,
    unit,
    decimals,
    values: [read(report)],
    baseline: base ? [read(base)] : null,
    limit,
  });
  return [
    row('Clock error (positive: the recorder’s clock runs slow against the player’s)', 'ppm', 1, (r) => r.clockErrorPpm, `within ±${thresholds.maxClockErrorPpm} (a warning)`),
    row('Gain difference between channels', 'dB', 2, (r) => r.channelGainMismatchDb, `at most ${thresholds.maxChannelGainMismatchDb}`),
    row('Worst crosstalk', 'dB', 1, (r) => r.crosstalkDb, `at most ${thresholds.maxCrosstalkDb}`),
    row('Delay of channel 2 against channel 1', 'samples', 0, (r) => r.interChannelDelaySamples, `at most ${thresholds.maxInterChannelDelaySamples} (a warning)`),
  ];
}
