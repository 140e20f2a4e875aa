import type { ConverterThresholds } from '@/dsp/converter/thresholds';

/** What each converter-check threshold means, for the form that edits them; safe to import from the browser. */
export const THRESHOLD_FIELDS: { key: keyof ConverterThresholds; label: string; unit: string; group: 'limit' | 'drift' }[] = [
  { key: 'maxGainErrorDb', label: 'Largest gain error at 997 Hz', unit: '± dB', group: 'limit' },
  { key: 'maxChannelGainMismatchDb', label: 'Largest gain difference between channels', unit: 'dB', group: 'limit' },
  { key: 'maxThdnDb', label: 'Highest THD+N at −1 dB FS', unit: 'dB', group: 'limit' },
  { key: 'minEnobBits', label: 'Fewest effective bits (ENOB) at −1 dB FS', unit: 'bits', group: 'limit' },
  { key: 'minDynamicRangeDb', label: 'Lowest dynamic range (AES17, unweighted)', unit: 'dB', group: 'limit' },
  { key: 'maxNoiseFloorDbfs', label: 'Highest idle noise (20 Hz – 20 kHz)', unit: 'dB FS', group: 'limit' },
  { key: 'maxPassbandDeviationDb', label: 'Largest passband deviation', unit: '± dB', group: 'limit' },
  { key: 'minBandEdgeHz', label: 'Lowest upper −3 dB point', unit: 'Hz', group: 'limit' },
  { key: 'maxCrosstalkDb', label: 'Highest crosstalk', unit: 'dB', group: 'limit' },
  { key: 'maxClockErrorPpm', label: 'Largest clock error (a warning)', unit: 'ppm', group: 'limit' },
  { key: 'maxInterChannelDelaySamples', label: 'Largest delay between channels (a warning)', unit: 'samples', group: 'limit' },
  { key: 'noiseRiseDb', label: 'Idle noise up by', unit: 'dB', group: 'drift' },
  { key: 'enobDropBits', label: 'Effective bits down by', unit: 'bits', group: 'drift' },
  { key: 'dynamicRangeDropDb', label: 'Dynamic range down by', unit: 'dB', group: 'drift' },
  { key: 'thdnRiseDb', label: 'THD+N up by', unit: 'dB', group: 'drift' },
  { key: 'gainDriftDb', label: 'Gain moved by', unit: 'dB', group: 'drift' },
  { key: 'bandEdgeShiftPercent', label: 'Upper −3 dB point moved by', unit: '%', group: 'drift' },
  { key: 'crosstalkRiseDb', label: 'Crosstalk up by', unit: 'dB', group: 'drift' },
  { key: 'clockDriftPpm', label: 'Clock error moved by', unit: 'ppm', group: 'drift' },
];
