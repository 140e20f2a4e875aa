/**
 * One name per idea, as DEVELOPERS.md's glossary lists them: the labels, units and status marks
 * that pages, the CSV, the PDF and e-mail all use. API and report field names stay as they are.
 * Safe to import from the browser.
 */
import type { Decision, Verdict } from '@/models/Take';

/** A measure's label and unit, the same in every table, chart and file. */
export const MEASURE = {
  effectiveBits: { label: 'Effective bits', unit: 'bits' },
  samplePeak: { label: 'Sample peak', unit: 'dBFS' },
  truePeak: { label: 'True peak', unit: 'dBTP' },
  integratedLoudness: { label: 'Integrated loudness', unit: 'LUFS' },
  noiseFloor: { label: 'Noise floor', unit: 'dBFS' },
  clipEvents: { label: 'Clipping events', unit: 'events' },
  duration: { label: 'Length', unit: 's' },
  sampleRate: { label: 'Sample rate', unit: 'Hz' },
  bitDepth: { label: 'Bit depth', unit: 'bits' },
  channels: { label: 'Channels', unit: '' },
} as const;

export type MeasureKey = keyof typeof MEASURE;

/** "True peak (dBTP)": a label with its unit, for column headings that stand without a value beside them. */
export function labelWithUnit(key: MeasureKey): string {
  const { label, unit } = MEASURE[key];
  return unit ? `${label} (${unit})` : label;
}

/** Every status is a word with a mark beside it, never a colour alone. */
export const VERDICT_LABEL: Record<Verdict | 'none', { mark: string; word: string }> = {
  pass: { mark: '✓', word: 'Pass' },
  warn: { mark: '▲', word: 'Warn' },
  fail: { mark: '✕', word: 'Fail' },
  none: { mark: '○', word: 'Not measured' },
};

export const DECISION_LABEL: Record<Decision, { mark: string; word: string }> = {
  approved: { mark: '●', word: 'Approved' },
  rejected: { mark: '■', word: 'Rejected' },
  pending: { mark: '○', word: 'Pending' },
};
