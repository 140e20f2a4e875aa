import { roundOrNull, roundTo } from '../util/decibels';
import type { BandPowerMeter } from './bandPower';
import type { AudioWindow } from './capture';
import { CHECK_TONE_HZ, CROSSTALK_HIGH_HZ, sectionNamed, type CheckSection, type CheckSignalLayout } from './checkSignal';
import type { MultitoneDesign } from './multitone';
import type { ConverterChannelReport } from './report';
import { measureResponse, passbandDeviation, upperBandEdge } from './response';
import { measureTone } from './toneMeasure';

/** Where the check signal sits in the recording and how fast it runs. */
export interface SignalClock {
  /** Recording rate, Hz. */
  rate: number;
  /** Recorded frequency / written frequency (1 + clock error). */
  ratio: number;
  /** Start of the start marker in the layout, seconds. */
  startMarkerSec: number;
}

/** One channel's captured windows and where its own start marker lies. */
export interface ChannelSpan {
  windows: AudioWindow[];
  /** Recording frame (fractional) where this channel's start marker begins. */
  markerFrame: number;
}

export interface MeasureContext {
  layout: CheckSignalLayout;
  clock: SignalClock;
  meter: BandPowerMeter;
  design: MultitoneDesign;
  /** Highest multitone frequency read, Hz. */
  topHz: number;
  /** Top of the AES17 band for THD+N, dynamic range and noise, Hz. */
  bandHigh: number;
  /** Top of the passband deviation, Hz. */
  passbandHigh: number;
}

/** Frequencies of the crosstalk tones, Hz. */
export const CROSSTALK_TONES_HZ = [CHECK_TONE_HZ, CROSSTALK_HIGH_HZ];
/** Skipped at each edge of a section before measuring, seconds (a fifth of a short section): fades, filter settling and channel delays. */
const SECTION_MARGIN_SEC = 0.25;
/** Sections measured, and the longest stretch of each that is (null: all of its steady part). */
export const MEASURED_SECTIONS = [
  ['format', null],
  ['toneMinus1', 2],
  ['toneMinus20', 2],
  ['toneMinus60', 2],
  ['idle', 2],
  ['multitone', null],
] as const;
/** A channel whose −1 dB FS tone records below this is dead, dB FS. [common practice] */
const DEAD_CHANNEL_DBFS = -60;
/** IEEE 1241 ENOB constants: ENOB = (SINAD − 1.76) / 6.02. */
const ENOB_OFFSET_DB = 1.76;
const DB_PER_BIT = 6.02;
/** Mean square of a full-scale sine: the 0 dB FS reference of AES17. */
const FULL_SCALE_SINE_POWER = 0.5;

/**
 * Frame range of the steady middle of a section (SECTION_MARGIN_SEC in from each edge, or a fifth
 * of a short section), at most `maxSec` long (2 s of a tone fixes the frequency to far better than
 * 0.01 ppm and band powers to a few hundredths of a dB).
 */
export function steadyRange(markerFrame: number, clock: SignalClock, section: CheckSection, maxSec: number | null): [number, number] {
  const at = (sec: number) => markerFrame + ((sec - clock.startMarkerSec) * clock.rate) / clock.ratio;
  const edge = Math.min(SECTION_MARGIN_SEC, section.durationSec / 5);
  const from = Math.round(at(section.startSec + edge));
  const to = Math.round(at(section.startSec + section.durationSec - edge));
  return [from, maxSec === null ? to : Math.min(to, from + Math.round(maxSec * clock.rate))];
}

/** The steady middle of a section in one channel, as float64, from whichever captured window holds it. */
export function steadyPart(span: ChannelSpan, clock: SignalClock, section: CheckSection): Float64Array {
  const limit = MEASURED_SECTIONS.find(([name]) => name === section.name)?.[1] ?? null;
  const [from, to] = steadyRange(span.markerFrame, clock, section, limit);
  const window = span.windows.find((w) => w.firstFrame <= from && from < w.firstFrame + w.samples.length);
  if (!window) return new Float64Array(0);
  return Float64Array.from(window.samples.subarray(from - window.firstFrame, Math.min(window.samples.length, to - window.firstFrame)));
}

/**
 * Everything measured on one channel alone. `polarity` is the summed marker polarity (negative:
 * inverted); `responding` says whether its markers were found at all; `clipped` counts its samples
 * at full scale over the whole signal and within the −1 dB FS tone.
 */
export function measureChannel(span: ChannelSpan, context: MeasureContext, responding: boolean, polarity: number, clipped: { signal: number; fullTone: number }): ConverterChannelReport {
  const { layout, clock, meter, bandHigh } = context;
  const omega = (clock.ratio * 2 * Math.PI * CHECK_TONE_HZ) / clock.rate;
  const steady = (name: Parameters<typeof sectionNamed>[1]) => steadyPart(span, clock, sectionNamed(layout, name));
  const idle = idleNoise(steady('idle'), meter, bandHigh);
  const full = measureTone(steady('toneMinus1'), omega, meter, 20, bandHigh);
  const dead = !responding || !full || full.amplitude < 10 ** (DEAD_CHANNEL_DBFS / 20);
  const report: ConverterChannelReport = {
    dead, clippedSamples: clipped.signal, gainDb: null, polarityInverted: null, thdnDb: { minus1: null, minus20: null }, sinadDb: null, enobBits: null,
    dynamicRangeDb: null, dynamicRangeDbA: null, ...idle, frequencyResponse: null, passbandDeviationDb: null, bandEdgeHz: null, delaySamples: null, crosstalkIntoDb: null,
  };
  if (dead || !full) return report;

  const fundamentalPower = (amplitude: number) => (amplitude * amplitude) / 2;
  const twenty = measureTone(steady('toneMinus20'), omega, meter, 20, bandHigh);
  const sixty = measureTone(steady('toneMinus60'), omega, meter, 20, bandHigh);
  const sinad = 10 * Math.log10(FULL_SCALE_SINE_POWER / full.residualMs);
  const response = measureResponse(steady('multitone'), clock.rate, context.design, clock.ratio, context.topHz);
  // A clipped −1 dB FS tone no longer tells the gain; the −20 dB FS tone still does.
  const gainDb = clipped.fullTone > 0 && twenty ? 20 * Math.log10(twenty.amplitude / 10 ** (-20 / 20)) : 20 * Math.log10(full.amplitude / 10 ** (-1 / 20));
  return {
    ...report,
    gainDb: roundTo(gainDb, 3),
    polarityInverted: polarity === 0 ? null : polarity < 0,
    thdnDb: {
      minus1: roundTo(10 * Math.log10(full.bandPower / fundamentalPower(full.amplitude)), 2),
      minus20: twenty ? roundTo(10 * Math.log10(twenty.bandPower / fundamentalPower(twenty.amplitude)), 2) : null,
    },
    sinadDb: roundTo(sinad, 2),
    enobBits: roundTo((sinad - ENOB_OFFSET_DB) / DB_PER_BIT, 2),
    // AES17 dynamic range: the noise and distortion with the −60 dB FS tone present, referred to full scale.
    dynamicRangeDb: sixty ? roundTo(10 * Math.log10(FULL_SCALE_SINE_POWER / sixty.bandPower), 2) : null,
    dynamicRangeDbA: sixty ? roundTo(10 * Math.log10(FULL_SCALE_SINE_POWER / sixty.bandPowerA), 2) : null,
    frequencyResponse: { hz: response.hz.map((v) => roundTo(v, 2)), db: response.db.map((v) => roundTo(Math.max(v, -200), 3)) },
    passbandDeviationDb: roundOrNull(passbandDeviation(response, 20, context.passbandHigh), 3),
    bandEdgeHz: roundOrNull(upperBandEdge(response, context.design.frequenciesHz[context.design.referenceIndex]), 1),
  };
}

/** Idle noise in dB FS: 20 Hz–20 kHz unweighted and A-weighted, and the whole band; null for digital zero. */
function idleNoise(x: Float64Array, meter: BandPowerMeter, bandHigh: number): Pick<ConverterChannelReport, 'noiseFloorDbfs' | 'noiseFloorDbfsA' | 'noiseFloorFullBandDbfs'> {
  if (x.every((v) => v === 0) || x.length < meter.segmentFrames) return { noiseFloorDbfs: null, noiseFloorDbfsA: null, noiseFloorFullBandDbfs: null };
  const spectrum = meter.spectrum(x, 0, x.length);
  const toDbfs = (power: number) => (power > 0 ? roundTo(10 * Math.log10(power / FULL_SCALE_SINE_POWER), 2) : null);
  let mean = 0;
  for (const v of x) mean += v;
  mean /= x.length;
  let meanSquare = 0;
  for (const v of x) meanSquare += (v - mean) ** 2;
  return {
    noiseFloorDbfs: toDbfs(meter.bandPower(spectrum, 20, bandHigh)),
    noiseFloorDbfsA: toDbfs(meter.bandPower(spectrum, 20, bandHigh, true)),
    noiseFloorFullBandDbfs: toDbfs(meanSquare / x.length),
  };
}
