import { describe, expect, it } from 'vitest';
import { KWeightingFilter, kWeightingCoefficients } from '../../../dsp/filters/kWeighting';

describe('K-weighting coefficients', () => {
  it('reproduce ITU-R BS.1770-4 Table 1 (pre-filter) and Table 2 (RLB) at 48 kHz', () => {
    const { shelf, highPass } = kWeightingCoefficients(48000);
    // BS.1770-4 Annex 1, Table 1 (values printed to 14 decimals).
    expect(shelf.b0).toBeCloseTo(1.53512485958697, 13);
    expect(shelf.b1).toBeCloseTo(-2.69169618940638, 13);
    expect(shelf.b2).toBeCloseTo(1.19839281085285, 13);
    expect(shelf.a1).toBeCloseTo(-1.69065929318241, 13);
    expect(shelf.a2).toBeCloseTo(0.73248077421585, 13);
    // BS.1770-4 Annex 1, Table 2.
    expect(highPass.a1).toBeCloseTo(-1.99004745483398, 13);
    expect(highPass.a2).toBeCloseTo(0.99007225036621, 13);
    expect([highPass.b0, highPass.b1, highPass.b2]).toEqual([1, -2, 1]);
  });

  // Other rates: re-derived from the prototype of "ITU-R BS.1770-1 filter specifications
  // (unofficial)", 2011, which reproduces Tables 1-2 at 48 kHz; table computed independently (numpy).
  const otherRates: [number, number[], number[]][] = [
    [44100, [1.53084123005035, -2.65097999515473, 1.16907907992159, -1.66365511325602, 0.71259542807323], [-1.9891696736298, 0.98919903578704]],
    [88200, [1.55751537557965, -2.90562707992634, 1.36133397747221, -1.83091998796233, 0.84414226108785], [-1.99457751545034, 0.99458487587805]],
    [96000, [1.5597142289758, -2.92674157825108, 1.37826120231582, -1.84460946989011, 0.85584332293064], [-1.99501754472472, 0.99502375904092]],
    [192000, [1.57222721509128, -3.04728305156155, 1.47797134097961, -1.92220223060749, 0.92511773511683], [-1.9975072228407, 0.99750877835551]],
    [32000, [1.51117789956876, -2.46488941336014, 1.04163327352229, -1.53904509625064, 0.62696685598156], [-1.98508966898869, 0.98514532066955]],
  ];
  it.each(otherRates)('match the independently derived table at %i Hz', (rate, shelfTable, highPassTable) => {
    const { shelf, highPass } = kWeightingCoefficients(rate);
    [shelf.b0, shelf.b1, shelf.b2, shelf.a1, shelf.a2].forEach((value, i) => expect(value).toBeCloseTo(shelfTable[i], 12));
    expect(highPass.a1).toBeCloseTo(highPassTable[0], 12);
    expect(highPass.a2).toBeCloseTo(highPassTable[1], 12);
  });

  it('refuses a sample rate the shelf cannot be placed at', () => {
    expect(() => kWeightingCoefficients(3000)).toThrow(RangeError);
    expect(() => new KWeightingFilter(Number.NaN)).toThrow(RangeError);
  });
});

describe('K-weighting filter', () => {
  // Steady-state gain measured by filtering a sine (the filter itself, not the coefficient formula),
  // against the magnitude of the published 48 kHz coefficients (computed independently, numpy).
  const response: [number, number][] = [
    [20, -13.275], [50, -3.934], [100, -1.133], [200, -0.265], [500, 0.042], [997, 0.691], [1500, 2.036],
    [2000, 3.071], [3000, 3.808], [5000, 4.013], [10000, 4.042],
  ];
  it.each(response)('has the BS.1770 magnitude at %i Hz (±0.005 dB)', (frequency, expectedDb) => {
    const rate = 48000;
    const seconds = Math.max(2, 40 / frequency);
    const frames = Math.round(seconds * rate);
    const input = new Float64Array(frames);
    for (let n = 0; n < frames; n++) input[n] = Math.sin((2 * Math.PI * frequency * n) / rate);
    const output = new Float64Array(frames);
    const filter = new KWeightingFilter(rate);
    // Two calls of uneven size: the state must carry across.
    filter.process(input, output, 777);
    filter.process(input.subarray(777), output.subarray(777), frames - 777);
    // Mean square over whole periods of the second half (transient gone).
    const period = rate / frequency;
    const start = Math.floor(frames / 2);
    const length = Math.floor(Math.floor((frames - start) / period) * period);
    let inPower = 0, outPower = 0;
    for (let n = start; n < start + length; n++) {
      inPower += input[n] * input[n];
      outPower += output[n] * output[n];
    }
    expect(10 * Math.log10(outPower / inPower)).toBeCloseTo(expectedDb, 2);
  });
});
