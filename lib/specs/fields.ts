import type { DeliverySpec as Spec } from '@/dsp/spec';

/** Safe to import from the browser: what each delivery-spec threshold means, its unit and where its default comes from. */
export type ThresholdKey = Exclude<keyof Spec, 'name'>;

export interface ThresholdField {
  key: ThresholdKey;
  label: string;
  /** Unit shown next to the input and in messages ('' for a switch). */
  unit: string;
  kind: 'number' | 'integer' | 'boolean' | 'rate' | 'bitDepth';
  step?: number;
  /** One sentence: what the threshold does, with its unit. */
  explain: string;
  /** Where Takeproof's default comes from: a named standard, or a project default. */
  source: string;
}

export const THRESHOLD_FIELDS: ThresholdField[] = [
  {
    key: 'loudnessTargetLufs',
    label: 'Loudness target',
    unit: 'LUFS',
    kind: 'number',
    step: 0.1,
    explain: 'The integrated programme loudness a take should reach, in LUFS (loudness units relative to full scale, measured per ITU-R BS.1770).',
    source: 'EBU R 128: −23 LUFS.',
  },
  {
    key: 'loudnessToleranceLu',
    label: 'Loudness tolerance',
    unit: 'LU',
    kind: 'number',
    step: 0.1,
    explain: 'How far, in LU either side of the target, the integrated loudness may lie.',
    source: 'EBU R 128: ±0.5 LU, or ±1 LU where the target cannot be met exactly (live); Takeproof’s default of 1 LU is a project default for raw takes.',
  },
  {
    key: 'loudnessIsStrict',
    label: 'Loudness outside the band fails the take',
    unit: '',
    kind: 'boolean',
    explain: 'On: loudness outside the band fails the take (for delivery masters). Off: it only warns (for raw takes that are mixed later).',
    source: 'off (Takeproof project default).',
  },
  {
    key: 'maxTruePeakDbtp',
    label: 'Highest true peak',
    unit: 'dBTP',
    kind: 'number',
    step: 0.1,
    explain: 'The highest inter-sample (true) peak allowed, in dBTP (decibels true peak, oversampled per ITU-R BS.1770).',
    source: 'EBU R 128: −1 dBTP.',
  },
  {
    key: 'minEffectiveBits',
    label: 'Fewest effective bits',
    unit: 'bits',
    kind: 'integer',
    explain: 'The number of bits the audio data must really use, in bits; a 24-bit file padded from 16-bit data uses only 16.',
    source: '20 bits (Takeproof project default).',
  },
  {
    key: 'maxNoiseFloorDbfs',
    label: 'Highest noise floor',
    unit: 'dBFS',
    kind: 'number',
    step: 0.5,
    explain: 'The highest RMS level allowed in the quietest passages, in dBFS (decibels relative to full scale).',
    source: '−60 dBFS (Takeproof project default).',
  },
  {
    key: 'maxClipEvents',
    label: 'Clipping events allowed',
    unit: 'events',
    kind: 'integer',
    explain: 'How many clipping events (runs of flat-topped samples, at or below full scale) a take may have before it fails, counted in events.',
    source: '0 events (Takeproof project default).',
  },
  {
    key: 'maxDcOffset',
    label: 'Largest DC offset',
    unit: '× full scale',
    kind: 'number',
    step: 0.0001,
    explain: 'The largest constant offset allowed, as a fraction of full scale (0.001 is −60 dBFS).',
    source: '0.001, that is −60 dBFS (Takeproof project default).',
  },
  {
    key: 'maxDropouts',
    label: 'Dropouts allowed',
    unit: 'dropouts',
    kind: 'integer',
    explain: 'How many dropouts (sudden stretches of digital silence or repeated samples) a take may have before it fails, counted in dropouts.',
    source: '0 dropouts (Takeproof project default).',
  },
  {
    key: 'requiredSampleRate',
    label: 'Required sample rate',
    unit: 'Hz',
    kind: 'rate',
    explain: 'The sample rate, in Hz, the delivery requires; takes at another declared rate fail. Leave empty to accept any rate.',
    source: 'AES5 names 48 000 Hz the preferred rate for professional use; Takeproof’s project default accepts any rate.',
  },
  {
    key: 'requiredBitDepth',
    label: 'Required bit depth',
    unit: 'bits',
    kind: 'bitDepth',
    explain: 'The container bit depth, in bits, the delivery requires (16, 24 or 32). Leave empty to accept any.',
    source: 'any bit depth (Takeproof project default).',
  },
  {
    key: 'minBandwidthRatio',
    label: 'Lowest bandwidth',
    unit: '× Nyquist',
    kind: 'number',
    step: 0.05,
    explain: 'The lowest effective audio bandwidth before a warning, as a fraction of the declared Nyquist frequency (half the sample rate).',
    source: '0.8 × Nyquist (Takeproof project default).',
  },
];

export const THRESHOLD_BY_KEY = Object.fromEntries(THRESHOLD_FIELDS.map((f) => [f.key, f])) as Record<ThresholdKey, ThresholdField>;

/** Shown wherever specs are edited or shown. */
export const SPEC_PRECEDENCE_NOTE =
  'The studio’s and the broadcaster’s own delivery specs, and local rules, take precedence over Takeproof’s defaults. Check the current version of each spec you deliver to.';
