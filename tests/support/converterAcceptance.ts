/**
 * Shared by the converter-check acceptance tests: a converter with defaults to override, a run of
 * the check signal through it, and the comparison of a report with the planted values, each row
 * with the tolerance the feature promises (clock 2 ppm, gain 0.1 dB, band edge 3 %, noise floor and
 * dynamic range 1.5 dB, THD+N 2 dB, ENOB 0.3 bit, crosstalk 2 dB, delay and polarity exact).
 */
import type { ConverterReport } from '../../dsp/converter/report';
import { writeCheckSignalFile } from '../../dsp/converter/signalWriter';
import { plantedValues, simulateRecording, type SimulatedConverter } from './converterSimulation';

export interface AcceptanceCase {
  rate: number;
  converter: SimulatedConverter;
}

/** A converter with mild defaults; `bits` and `gainsDb` (one per channel) are required. */
export function simulatedConverter(overrides: Partial<SimulatedConverter> & Pick<SimulatedConverter, 'bits' | 'gainsDb'>): SimulatedConverter {
  const channels = overrides.gainsDb.length;
  return {
    inverted: Array(channels).fill(false),
    lowPass: { cutoffHz: 18000, order: 6 },
    noiseDbfs: -90,
    secondOrder: 0.002,
    crosstalk: [],
    delaySamples: Array(channels).fill(0),
    clockPpm: 100,
    leadSec: 4,
    tailSec: 3,
    seed: 1,
    ...overrides,
  };
}

/** Writes the check signal for the case (unless one is given) and records it through the converter. */
export async function recordThroughConverter({ rate, converter }: AcceptanceCase, path: (name: string) => string, signalPath?: string): Promise<string> {
  const name = `${rate}-${converter.bits}-${converter.gainsDb.length}-${converter.seed}`;
  const signal = signalPath ?? path(`signal-${name}.wav`);
  if (!signalPath) await writeCheckSignalFile(signal, { sampleRate: rate, bitsPerSample: converter.bits, channels: converter.gainsDb.length });
  const recording = path(`recording-${name}.wav`);
  await simulateRecording(signal, path, converter, recording);
  return recording;
}

export interface Comparison {
  what: string;
  measured: number | boolean | null;
  planted: number | boolean | null;
  /** Largest allowed |measured − planted| (relative for the band edge); 0 = exact. */
  tolerance: number;
}

/** Every promised value of a report beside its planted value. */
export function comparePlanted(report: ConverterReport, { rate, converter }: AcceptanceCase): Comparison[] {
  const planted = plantedValues(converter, rate, converter.bits);
  const rows: Comparison[] = [{ what: 'clock error, ppm', measured: report.clockErrorPpm, planted: planted.clockErrorPpm, tolerance: 2 }];
  report.channels.forEach((channel, c) => {
    const on = (what: string) => `channel ${c + 1} ${what}`;
    rows.push(
      { what: on('dead'), measured: channel.dead, planted: false, tolerance: 0 },
      { what: on('polarity inverted'), measured: channel.polarityInverted, planted: planted.polarityInverted[c], tolerance: 0 },
      { what: on('gain, dB'), measured: channel.gainDb, planted: planted.gainDb[c], tolerance: 0.1 },
      { what: on('band edge / planted'), measured: channel.bandEdgeHz === null ? null : channel.bandEdgeHz / planted.bandEdgeHz, planted: 1, tolerance: 0.03 },
      { what: on('noise floor, dB FS'), measured: channel.noiseFloorDbfs, planted: planted.noiseFloorDbfs, tolerance: 1.5 },
      { what: on('dynamic range, dB'), measured: channel.dynamicRangeDb, planted: planted.dynamicRangeDb[c], tolerance: 1.5 },
      { what: on('THD+N at −1 dB FS, dB'), measured: channel.thdnDb.minus1, planted: planted.thdnMinus1Db[c], tolerance: 2 },
      { what: on('THD+N at −20 dB FS, dB'), measured: channel.thdnDb.minus20, planted: planted.thdnMinus20Db[c], tolerance: 2 },
      { what: on('ENOB, bits'), measured: channel.enobBits, planted: planted.enobBits[c], tolerance: 0.3 },
      { what: on('delay against channel 1, samples'), measured: channel.delaySamples, planted: planted.delaySamples[c], tolerance: 0 },
    );
  });
  const count = converter.gainsDb.length;
  if (count > 1) {
    const worstDelay = planted.delaySamples.slice(1).reduce((a, b) => (Math.abs(b) > Math.abs(a) ? b : a));
    rows.push(
      { what: 'inter-channel delay, samples', measured: report.interChannelDelaySamples, planted: worstDelay, tolerance: 0 },
      { what: 'crosstalk, dB', measured: report.crosstalkDb, planted: planted.crosstalkDb, tolerance: 2 },
      { what: 'gain mismatch, dB', measured: report.channelGainMismatchDb, planted: Math.max(...planted.gainDb) - Math.min(...planted.gainDb), tolerance: 0.1 },
    );
    for (const path of converter.crosstalk) {
      const measured = report.crosstalkPaths.find((p) => p.driven === path.from && p.into === path.into);
      const expected = path.db + converter.gainsDb[path.into] - converter.gainsDb[path.from];
      (measured?.db ?? [null]).forEach((db, t) => rows.push({ what: `crosstalk ${path.from + 1} → ${path.into + 1} at tone ${t + 1}, dB`, measured: db, planted: expected, tolerance: 2 }));
    }
  } else {
    rows.push({ what: 'crosstalk (one channel)', measured: report.crosstalkDb, planted: null, tolerance: 0 }, { what: 'inter-channel delay (one channel)', measured: report.interChannelDelaySamples, planted: null, tolerance: 0 });
  }
  return rows;
}

/** The rows whose measured value misses the planted one by more than the tolerance. */
export function outOfTolerance(rows: Comparison[]): Comparison[] {
  return rows.filter(({ measured, planted, tolerance }) => {
    if (typeof measured === 'number' && typeof planted === 'number') return !(Math.abs(measured - planted) <= tolerance);
    return measured !== planted;
  });
}
