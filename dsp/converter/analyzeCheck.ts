import { createReadStream } from 'node:fs';
import type { Readable } from 'node:stream';
import { openWav } from '../reader/wavReader';
import { roundOrNull, roundTo } from '../util/decibels';
import { fitSine } from '../util/sineFit';
import { BandPowerMeter } from './bandPower';
import { captureSpan } from './capture';
import { CHECK_TONE_HZ, checkSignalLayout, CROSSTALK_HIGH_HZ, MAX_CHECK_CHANNELS, MAX_CHECK_RATE_HZ, MIN_CHECK_RATE_HZ, sectionNamed, sectionsNamed, type CheckSection } from './checkSignal';
import { ConverterCheckError } from './ConverterCheckError';
import { channelDelay } from './delay';
import { identifyWrittenFormat } from './formatId';
import { judgeConverterCheck } from './judge';
import { locateSignal, markerDistanceSec } from './locate';
import { markerFrames } from './markers';
import { MarkerSearch } from './markerSearch';
import { refineMarker } from './markerRefine';
import { designMultitone, HIGHEST_TONE_FRACTION } from './multitone';
import type { ConverterChannelReport, ConverterReport, CrosstalkPath } from './report';
import { measureResponse, passbandDeviation, upperBandEdge } from './response';
import { DEFAULT_CONVERTER_THRESHOLDS, type ConverterThresholds } from './thresholds';
import { measureTone, toneAmplitude } from './toneMeasure';

/**
 * Converter check analysis. Two reads of the recording: the first finds the start and end
 * markers anywhere in it (any lead-in, gain, polarity, delay or clock error up to ±0.1 %); the
 * second keeps just the check signal. The markers give each channel's position and a first clock
 * estimate; a four-parameter sine fit of the −1 dB FS tone gives the clock to a fraction of a ppm;
 * every section is then read from its steady middle (SECTION_MARGIN_SEC from each edge).
 */

export interface ConverterCheckOptions {
  thresholds?: ConverterThresholds;
  /** The recorder's baseline check, when it has one. */
  baseline?: ConverterReport | null;
}

export const SIGNAL_VERSION = 1;
const LEVEL_REFERENCE = 'dB FS: a full-scale sine reads 0 dB FS (AES17). Take reports differ: their RMS levels are referred to a full-scale square wave.';
/** Skipped at each edge of a section before measuring, seconds (a fifth of a short section): fades, filter settling and channel delays. */
const SECTION_MARGIN_SEC = 0.25;
/** Kept around the signal in the second read, seconds. */
const CAPTURE_MARGIN_SEC = 0.5;
/** Largest delay between channels looked for, seconds. */
const MAX_CHANNEL_DELAY_SEC = 0.01;
/** A channel whose markers match less than this carries no usable signal. [common practice] */
const MIN_MARKER_MATCH = 0.3;
/** A channel whose −1 dB FS tone records below this is dead, dB FS. [common practice] */
const DEAD_CHANNEL_DBFS = -60;
/** Samples this close to full scale count as clipped (the top code of 16-bit PCM and above). */
const CLIP_LEVEL = 1 - 2 ** -15;
/**
 * Longest stretch of a tone or of idle noise measured, seconds: the sine fit's frequency is then
 * good to far better than 0.01 ppm and band powers to a few hundredths of a dB, at half the work.
 */
const TONE_SPAN_SEC = 2;
/** Length of multitone compared between channels for their delay, seconds. */
const DELAY_SPAN_SEC = 0.5;
/** Crosstalk below this is reported as this (an undriven channel of digital zero has none at all), dB. */
const CROSSTALK_FLOOR_DB = -200;
/** IEEE 1241 ENOB constants: ENOB = (SINAD − 1.76) / 6.02. */
const ENOB_OFFSET_DB = 1.76;
const DB_PER_BIT = 6.02;
/** Mean square of a full-scale sine: the 0 dB FS reference of AES17. */
const FULL_SCALE_SINE_POWER = 0.5;

/** Analyses a check recording on disk. */
export function analyzeConverterCheckFile(path: string, options: ConverterCheckOptions = {}): Promise<ConverterReport> {
  return analyzeConverterCheck(() => createReadStream(path), options);
}

/**
 * Analyses a check recording read twice through `open` (each call must return a fresh stream of
 * the whole file).
 * @throws UnreadableWavError for a file that is not a readable WAV
 * @throws ConverterCheckError when the recording holds no complete check signal of its channel count
 */
export async function analyzeConverterCheck(open: () => Readable, options: ConverterCheckOptions = {}): Promise<ConverterReport> {
  const opened = await openWav(open());
  const { format } = opened;
  const rate = format.sampleRate;
  const channelCount = format.channels;
  if (rate < MIN_CHECK_RATE_HZ || rate > MAX_CHECK_RATE_HZ) {
    await drain(opened.blocks());
    throw new ConverterCheckError('unsupported-format', `The recording is at ${rate} Hz; a converter check needs ${MIN_CHECK_RATE_HZ / 1000}–${MAX_CHECK_RATE_HZ / 1000} kHz.`);
  }
  if (channelCount > MAX_CHECK_CHANNELS) {
    await drain(opened.blocks());
    throw new ConverterCheckError('unsupported-format', `The recording has ${channelCount} channels; a converter check measures at most ${MAX_CHECK_CHANNELS}.`);
  }
  const search = new MarkerSearch(rate, channelCount);
  for await (const block of opened.blocks()) search.push(block.channels, block.frames);
  const totalFrames = opened.framesRead();
  const candidates = search.finish();
  const located = locateSignal(candidates.start, candidates.end, rate, channelCount);

  const markerLength = markerFrames(rate);
  const margin = Math.round(CAPTURE_MARGIN_SEC * rate);
  const captureFrom = Math.max(0, located.startFrame - margin);
  const captureTo = Math.min(totalFrames, located.endFrame + markerLength + margin);
  const capture = await captureSpan(open(), captureFrom, captureTo);

  const radius = search.positionUncertainty + Math.round(MAX_CHANNEL_DELAY_SEC * rate);
  const starts = capture.map((x) => refineMarker(x, located.startFrame - captureFrom, radius, rate, 'up'));
  const ends = capture.map((x) => refineMarker(x, located.endFrame - captureFrom, radius, rate, 'down'));
  const responding = starts.map((start, c) => start.match >= MIN_MARKER_MATCH && ends[c].match >= MIN_MARKER_MATCH);
  const respondingIndices = responding.flatMap((ok, c) => (ok ? [c] : []));
  if (respondingIndices.length === 0) {
    throw new ConverterCheckError('no-signal', 'The check signal\'s markers were found but no channel carries them clearly enough to measure.');
  }
  const mean = (values: number[]) => values.reduce((sum, v) => sum + v, 0) / values.length;
  const meanStart = mean(respondingIndices.map((c) => starts[c].position));
  const startPositions = starts.map((start, c) => (responding[c] ? start.position : meanStart));
  const recordedDistance = mean(respondingIndices.map((c) => ends[c].position - starts[c].position));
  const markerRatio = (markerDistanceSec(channelCount) * rate) / recordedDistance;

  const layout = checkSignalLayout(channelCount);
  const startMarkerSec = sectionNamed(layout, 'startMarker').startSec;
  const lead = respondingIndices.reduce((best, c) => (starts[c].match > starts[best].match ? c : best), respondingIndices[0]);

  /** The steady middle of a section in one channel, as float64 (capture indices follow the channel's own marker). */
  const steady = (section: CheckSection, c: number, ratio: number, maxSec = Number.POSITIVE_INFINITY): Float64Array => {
    const at = (sec: number) => startPositions[c] + ((sec - startMarkerSec) * rate) / ratio;
    const edge = Math.min(SECTION_MARGIN_SEC, section.durationSec / 5);
    const from = Math.round(at(section.startSec + edge));
    const to = Math.min(Math.round(at(section.startSec + section.durationSec - edge)), from + Math.round(maxSec * rate));
    return Float64Array.from(capture[c].subarray(Math.max(0, from), Math.min(capture[c].length, to)));
  };

  // Clock: the −1 dB FS tone's frequency from a four-parameter fit on the clearest channel.
  const fullTone = sectionNamed(layout, 'toneMinus1');
  const leadTone = steady(fullTone, lead, markerRatio, TONE_SPAN_SEC);
  const fitted = fitSine(leadTone, 0, leadTone.length, (2 * Math.PI * CHECK_TONE_HZ * markerRatio) / rate, rate);
  const ratio = fitted && fitted.omega > 0 ? (fitted.omega * rate) / (2 * Math.PI * CHECK_TONE_HZ) : markerRatio;
  const omegaOf = (hz: number) => (2 * Math.PI * hz * ratio) / rate;

  const written = identifyWrittenFormat(steady(sectionNamed(layout, 'format'), lead, ratio), rate, ratio);
  const writtenRate = written.sampleRate ?? rate;
  const design = designMultitone(writtenRate);
  const topHz = HIGHEST_TONE_FRACTION * Math.min(rate, writtenRate);

  const meter = new BandPowerMeter(rate);
  const bandHigh = Math.min(20_000, rate / 2);
  const passbandHigh = Math.min(20_000, 0.45 * rate, 0.45 * writtenRate);
  const referenceHz = design.frequenciesHz[design.referenceIndex];
  const signalStart = (c: number) => Math.max(0, Math.floor(startPositions[c]));
  const signalEnd = (c: number) => Math.min(capture[c].length, Math.ceil((responding[c] ? ends[c].position : mean(respondingIndices.map((r) => ends[r].position))) + markerLength));

  const channels: ConverterChannelReport[] = capture.map((x, c) => {
    let clippedSamples = 0;
    for (let n = signalStart(c); n < signalEnd(c); n++) if (Math.abs(x[n]) >= CLIP_LEVEL) clippedSamples++;
    const idle = idleNoise(steady(sectionNamed(layout, 'idle'), c, ratio, TONE_SPAN_SEC), meter, bandHigh);
    const full = measureTone(steady(fullTone, c, ratio, TONE_SPAN_SEC), omegaOf(CHECK_TONE_HZ), meter, 20, bandHigh);
    const dead = !responding[c] || !full || full.amplitude < 10 ** (DEAD_CHANNEL_DBFS / 20);
    const base: ConverterChannelReport = {
      dead, clippedSamples, gainDb: null, polarityInverted: null, thdnDb: { minus1: null, minus20: null }, sinadDb: null, enobBits: null,
      dynamicRangeDb: null, dynamicRangeDbA: null, ...idle, frequencyResponse: null, passbandDeviationDb: null, bandEdgeHz: null, delaySamples: null, crosstalkIntoDb: null,
    };
    if (dead || !full) return base;
    const fundamentalPower = (amplitude: number) => (amplitude * amplitude) / 2;
    const twenty = measureTone(steady(sectionNamed(layout, 'toneMinus20'), c, ratio, TONE_SPAN_SEC), omegaOf(CHECK_TONE_HZ), meter, 20, bandHigh);
    const sixty = measureTone(steady(sectionNamed(layout, 'toneMinus60'), c, ratio, TONE_SPAN_SEC), omegaOf(CHECK_TONE_HZ), meter, 20, bandHigh);
    const sinad = 10 * Math.log10(FULL_SCALE_SINE_POWER / full.residualMs);
    const response = measureResponse(steady(sectionNamed(layout, 'multitone'), c, ratio), rate, design, ratio, topHz);
    const polarity = starts[c].polarity + ends[c].polarity;
    return {
      ...base,
      gainDb: roundTo(20 * Math.log10(full.amplitude / 10 ** (-1 / 20)), 3),
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
      passbandDeviationDb: roundOrNull(passbandDeviation(response, 20, passbandHigh), 3),
      bandEdgeHz: roundOrNull(upperBandEdge(response, referenceHz), 1),
    };
  });

  // Delay against channel 1, from the multitone where every channel carries the same signal.
  const multitone = sectionNamed(layout, 'multitone');
  const delayFrom = Math.round(startPositions[0] + ((multitone.startSec + SECTION_MARGIN_SEC - startMarkerSec) * rate) / ratio);
  channels.forEach((channel, c) => {
    if (channel.dead || channels[0].dead) return;
    // `+ 0` turns the −0 of Math.round(−0.3) into 0.
    channel.delaySamples = c === 0 ? 0 : Math.round(channelDelay(capture[0], capture[c], delayFrom, Math.round(DELAY_SPAN_SEC * rate), startPositions[c] - startPositions[0])) + 0;
  });

  const crosstalkTonesHz = [CHECK_TONE_HZ, CROSSTALK_HIGH_HZ];
  const crosstalkPaths: CrosstalkPath[] = [];
  for (const section of sectionsNamed(layout, 'crosstalk')) {
    const driven = section.drivenChannel!;
    if (channels[driven].dead) continue;
    const amplitudes = capture.map((_, c) => {
      const x = steady(section, c, ratio, TONE_SPAN_SEC);
      return crosstalkTonesHz.map((hz) => toneAmplitude(x, omegaOf(hz)));
    });
    channels.forEach((channel, into) => {
      if (into === driven || channel.dead) return;
      const db = crosstalkTonesHz.map((_, t) => roundTo(Math.max(CROSSTALK_FLOOR_DB, 20 * Math.log10(amplitudes[into][t] / amplitudes[driven][t])), 2));
      crosstalkPaths.push({ driven, into, db });
      channel.crosstalkIntoDb = Math.max(channel.crosstalkIntoDb ?? Number.NEGATIVE_INFINITY, ...db);
    });
  }

  const liveGains = channels.filter((channel) => !channel.dead).map((channel) => channel.gainDb!);
  const delays = channels.slice(1).map((channel) => channel.delaySamples).filter((delay): delay is number => delay !== null);
  const report: ConverterReport = {
    kind: 'converter-check',
    signalVersion: SIGNAL_VERSION,
    levelReference: LEVEL_REFERENCE,
    file: {
      container: format.container,
      encoding: format.encoding,
      sampleRate: rate,
      bitsPerSample: format.bitsPerSample,
      channels: channelCount,
      frames: totalFrames,
      durationSec: roundTo(totalFrames / rate, 3),
    },
    signal: {
      startSec: roundTo((captureFrom + starts[lead].position) / rate, 4),
      endSec: roundTo((captureFrom + ends[lead].position + markerLength) / rate, 4),
      markerMatch: roundTo(mean(respondingIndices.map((c) => (starts[c].match + ends[c].match) / 2)), 3),
      writtenSampleRate: written.sampleRate,
      writtenBits: written.bitsPerSample,
    },
    clockErrorPpm: roundTo((ratio - 1) * 1e6, 2),
    channels,
    crosstalkDb: crosstalkPaths.length ? Math.max(...crosstalkPaths.flatMap((path) => path.db)) : null,
    crosstalkTonesHz,
    crosstalkPaths,
    channelGainMismatchDb: liveGains.length > 1 ? roundTo(Math.max(...liveGains) - Math.min(...liveGains), 3) : null,
    interChannelDelaySamples: delays.length ? delays.reduce((worst, delay) => (Math.abs(delay) > Math.abs(worst) ? delay : worst), delays[0]) : null,
    bands: { thdnHz: [20, bandHigh], noiseHz: [20, bandHigh], passbandHz: [20, roundTo(passbandHigh, 1)], responseHz: [roundTo(design.frequenciesHz[0], 2), roundTo(topHz, 1)], sinad: 'DC excluded, up to Nyquist (IEEE 1241)' },
    findings: [],
  };
  report.findings = judgeConverterCheck(report, options.baseline ?? null, options.thresholds ?? DEFAULT_CONVERTER_THRESHOLDS);
  return report;
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

/** Starts and stops a block generator, so the reader closes its stream. */
async function drain(blocks: AsyncGenerator<unknown>): Promise<void> {
  await blocks.next();
  await blocks.return(undefined);
}
