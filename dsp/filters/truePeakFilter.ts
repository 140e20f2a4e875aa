/**
 * The order-48, 4-phase FIR interpolator of ITU-R BS.1770-4 Annex 2 (12 taps
 * per phase). Phase p of the 4x over-sampled signal is y_p[n] = sum_k h_p[k]·x[n-k].
 */
export const TRUE_PEAK_PHASES: readonly Float64Array[] = [
  Float64Array.from([0.001708984375, 0.010986328125, -0.0196533203125, 0.033203125, -0.0594482421875, 0.1373291015625, 0.97216796875, -0.102294921875, 0.047607421875, -0.0266113281250, 0.014892578125, -0.00830078125]),
  Float64Array.from([-0.0291748046875, 0.029296875, -0.0517578125, 0.0891113281250, -0.16650390625, 0.465087890625, 0.77978515625, -0.2003173828125, 0.1015625, -0.0582275390625, 0.0330810546875, -0.0189208984375]),
  Float64Array.from([-0.0189208984375, 0.0330810546875, -0.0582275390625, 0.1015625, -0.2003173828125, 0.77978515625, 0.465087890625, -0.16650390625, 0.0891113281250, -0.0517578125, 0.029296875, -0.0291748046875]),
  Float64Array.from([-0.00830078125, 0.014892578125, -0.0266113281250, 0.047607421875, -0.102294921875, 0.97216796875, 0.1373291015625, -0.0594482421875, 0.033203125, -0.0196533203125, 0.010986328125, 0.001708984375]),
];

export const TRUE_PEAK_TAPS_PER_PHASE = 12;

/** Largest sum of |h| over the phases: no interpolated value can exceed this times the largest |x| in its window. */
export const TRUE_PEAK_MAX_GAIN = Math.max(...TRUE_PEAK_PHASES.map((phase) => phase.reduce((sum, tap) => sum + Math.abs(tap), 0)));

/** Largest |h5| + |h6| over the phases: taps 5 and 6 (the samples either side of the interpolated point) carry most of each phase's weight. */
export const TRUE_PEAK_CENTRE_GAIN = Math.max(...TRUE_PEAK_PHASES.map((phase) => Math.abs(phase[5]) + Math.abs(phase[6])));

/** Largest sum of |h| over the other ten taps of a phase. */
export const TRUE_PEAK_SIDE_GAIN = Math.max(...TRUE_PEAK_PHASES.map((phase) => phase.reduce((sum, tap, k) => (k === 5 || k === 6 ? sum : sum + Math.abs(tap)), 0)));
