/**
 * One name per idea, as DEVELOPERS.md's glossary lists them: the labels, units and status marks
 * that pages, the CSV, the PDF and e-mail all use (statuses: lib/status.ts). API and report field names stay as they are.
 * Safe to import from the browser.
 */
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
