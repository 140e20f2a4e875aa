/**
 * K-weighting (ITU-R BS.1770 Annex 1): a high-shelf "head" pre-filter followed
 * by the RLB high-pass, each a biquad H(z) = (b0 + b1 z^-1 + b2 z^-2) / (1 + a1 z^-1 + a2 z^-2).
 */
export interface BiquadCoefficients {
  b0: number;
  b1: number;
  b2: number;
  a1: number;
  a2: number;
}

export interface KWeightingCoefficients {
  shelf: BiquadCoefficients;
  highPass: BiquadCoefficients;
}

// Analogue prototype parameters that reproduce BS.1770 Tables 1-2 at 48 kHz through a
// pre-warped bilinear transform ("ITU-R BS.1770-1 filter specifications (unofficial)", 2011).
const SHELF_CENTRE_HZ = 1681.974450955533;
const SHELF_Q = 0.7071752369554196;
const SHELF_HIGH_GAIN = 1.584864701130855; // Vh, +4 dB
const SHELF_BAND_GAIN = 1.258720930232562; // Vb, about sqrt(Vh)
const HIGH_PASS_CORNER_HZ = 38.13547087602444;
const HIGH_PASS_Q = 0.5003270373238773;

/**
 * K-weighting coefficients for a sample rate, derived from the analogue prototype.
 * At 48 kHz they equal BS.1770 Tables 1 and 2.
 * @param sampleRate Hz, > 2 × the shelf centre (about 3.4 kHz)
 */
export function kWeightingCoefficients(sampleRate: number): KWeightingCoefficients {
  if (!(sampleRate > 2 * SHELF_CENTRE_HZ)) throw new RangeError(`K-weighting needs a sample rate above ${Math.ceil(2 * SHELF_CENTRE_HZ)} Hz, got ${sampleRate}`);
  const kShelf = Math.tan((Math.PI * SHELF_CENTRE_HZ) / sampleRate);
  const shelfDenominator = 1 + kShelf / SHELF_Q + kShelf * kShelf;
  const shelf: BiquadCoefficients = {
    b0: (SHELF_HIGH_GAIN + (SHELF_BAND_GAIN * kShelf) / SHELF_Q + kShelf * kShelf) / shelfDenominator,
    b1: (2 * (kShelf * kShelf - SHELF_HIGH_GAIN)) / shelfDenominator,
    b2: (SHELF_HIGH_GAIN - (SHELF_BAND_GAIN * kShelf) / SHELF_Q + kShelf * kShelf) / shelfDenominator,
    a1: (2 * (kShelf * kShelf - 1)) / shelfDenominator,
    a2: (1 - kShelf / SHELF_Q + kShelf * kShelf) / shelfDenominator,
  };
  const kHighPass = Math.tan((Math.PI * HIGH_PASS_CORNER_HZ) / sampleRate);
  const highPassDenominator = 1 + kHighPass / HIGH_PASS_Q + kHighPass * kHighPass;
  // The RLB numerator stays [1, -2, 1], un-normalised, exactly as BS.1770 Table 2 publishes it.
  const highPass: BiquadCoefficients = {
    b0: 1,
    b1: -2,
    b2: 1,
    a1: (2 * (kHighPass * kHighPass - 1)) / highPassDenominator,
    a2: (1 - kHighPass / HIGH_PASS_Q + kHighPass * kHighPass) / highPassDenominator,
  };
  return { shelf, highPass };
}

/**
 * The two K-weighting biquads for one channel, direct form I, with state kept
 * across calls so blocks of any size give the same output as one long call.
 */
export class KWeightingFilter {
  private readonly shelf: BiquadCoefficients;
  private readonly highPass: BiquadCoefficients;
  // Previous inputs/outputs of each stage (direct form I state).
  private shelfInput1 = 0;
  private shelfInput2 = 0;
  private shelfOutput1 = 0;
  private shelfOutput2 = 0;
  private highPassOutput1 = 0;
  private highPassOutput2 = 0;

  /** @param sampleRate Hz */
  constructor(sampleRate: number) {
    const coefficients = kWeightingCoefficients(sampleRate);
    this.shelf = coefficients.shelf;
    this.highPass = coefficients.highPass;
  }

  /** Filters `input[0..frames)` into `output[0..frames)` (may be the same array). */
  process(input: Float64Array, output: Float64Array, frames: number): void {
    const { b0, b1, b2, a1, a2 } = this.shelf;
    const hpA1 = this.highPass.a1;
    const hpA2 = this.highPass.a2;
    let x1 = this.shelfInput1, x2 = this.shelfInput2, y1 = this.shelfOutput1, y2 = this.shelfOutput2;
    let z1 = this.highPassOutput1, z2 = this.highPassOutput2;
    for (let i = 0; i < frames; i++) {
      const x = input[i];
      const shelved = b0 * x + b1 * x1 + b2 * x2 - a1 * y1 - a2 * y2;
      // High-pass input history is the shelf output history (y), numerator [1, -2, 1].
      const weighted = shelved - 2 * y1 + y2 - hpA1 * z1 - hpA2 * z2;
      x2 = x1; x1 = x;
      y2 = y1; y1 = shelved;
      z2 = z1; z1 = weighted;
      output[i] = weighted;
    }
    this.shelfInput1 = x1; this.shelfInput2 = x2; this.shelfOutput1 = y1; this.shelfOutput2 = y2;
    this.highPassOutput1 = z1; this.highPassOutput2 = z2;
  }
}
