/** 20·log10 of an amplitude ratio; null for zero (no level to state). */
export function amplitudeToDb(amplitude: number): number | null {
  return amplitude > 0 ? 20 * Math.log10(amplitude) : null;
}

/** 10·log10 of a power ratio; null for zero. */
export function powerToDb(power: number): number | null {
  return power > 0 ? 10 * Math.log10(power) : null;
}

/** Rounds to a fixed number of decimals for the report (keeps JSON short and stable). */
export function roundTo(value: number, decimals: number): number {
  const scale = 10 ** decimals;
  return Math.round(value * scale) / scale;
}

/** roundTo for a value that may be null. */
export function roundOrNull(value: number | null, decimals: number): number | null {
  return value === null ? null : roundTo(value, decimals);
}

/** 10·log10 of a power ratio, taking powers below `floor` as `floor` (for spectra, where a bin may hold zero). */
export function powerToDbFloored(power: number, floor: number): number {
  return 10 * Math.log10(power > floor ? power : floor);
}
