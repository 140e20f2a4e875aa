import { createReadStream } from 'node:fs';
import type { Readable } from 'node:stream';
import { openWav } from '../reader/wavReader';
import { roundTo } from '../util/decibels';
import { fitSine } from '../util/sineFit';
import { BandPowerMeter } from './bandPower';
import { ClipCounter, readPass, WindowCapture } from './capture';
import { CROSSTALK_TONES_HZ, MEASURED_SECTIONS, measureChannel, steadyPart, steadyRange, type ChannelSpan, type MeasureContext, type SignalClock } from './channelMeasure';
import { CHECK_TONE_HZ, checkSignalLayout, MAX_CHECK_CHANNELS, MAX_CHECK_RATE_HZ, MIN_CHECK_RATE_HZ, sectionNamed, sectionsNamed, type CheckSignalLayout } from './checkSignal';
import { ConverterCheckError } from './ConverterCheckError';
import { CrosstalkMeter, leakagePaths } from './crosstalkMeter';
import { channelDelay } from './delay';
import { identifyWrittenFormat, type WrittenFormat } from './formatId';
import { judgeConverterCheck } from './judge';
import { locateSignal, markerDistanceSec } from './locate';
import { placeChannels } from './channelPlacement';
import { markerFrames } from './markers';
import { MarkerSearch } from './markerSearch';
import { designMultitone, HIGHEST_TONE_FRACTION } from './multitone';
import type { ConverterChannelReport, ConverterReport, CrosstalkPath } from './report';
import { DEFAULT_CONVERTER_THRESHOLDS, type ConverterThresholds } from './thresholds';

/**
 * Converter check analysis in three reads of the recording, none holding more than the parts it
 * measures. The first finds the start and end markers anywhere in it (any lead-in, gain, polarity,
 * delay or clock error up to ±0.1 %). The second keeps, for every channel, the markers and the
 * steady middles of the sections measured on their own (about 12 s per channel) and counts samples
 * at full scale; the markers place each channel, a four-parameter sine fit of the clearest channel's
 * −1 dB FS tone gives the clock to a fraction of a ppm, and each channel is measured. The third
 * measures the crosstalk tones as they stream past.
 */

export interface ConverterCheckOptions {
  thresholds?: ConverterThresholds;
  /** The recorder's baseline check, when it has one. */
  baseline?: ConverterReport | null;
}

export const SIGNAL_VERSION = 1;
const LEVEL_REFERENCE = 'dB FS: a full-scale sine reads 0 dB FS (AES17). Take reports differ: their RMS levels are referred to a full-scale square wave.';
/** Largest delay between channels looked for, seconds. */
const MAX_CHANNEL_DELAY_SEC = 0.01;
/** Extra room around each captured window for the first position estimate's error, seconds. */
const WINDOW_SLACK_SEC = 0.005;
/** Length of multitone compared between channels for their delay, seconds, from a second into it. */
const DELAY_SPAN_SEC = 0.5;
const DELAY_OFFSET_SEC = 1;

/** Analyses a check recording on disk. */
export function analyzeConverterCheckFile(path: string, options: ConverterCheckOptions = {}): Promise<ConverterReport> {
  return analyzeConverterCheck(() => createReadStream(path), options);
}

/**
 * Analyses a check recording read several times through `open` (each call must return a fresh
 * stream of the whole file).
 * @throws UnreadableWavError for a file that is not a readable WAV
 * @throws ConverterCheckError when the recording holds no complete check signal of its channel count
 */
export async function analyzeConverterCheck(open: () => Readable, options: ConverterCheckOptions = {}): Promise<ConverterReport> {
  const opened = await openWav(open());
  const { format } = opened;
  const rate = format.sampleRate;
  const channelCount = format.channels;
  if (rate < MIN_CHECK_RATE_HZ || rate > MAX_CHECK_RATE_HZ || channelCount > MAX_CHECK_CHANNELS) {
    const blocks = opened.blocks();
    await blocks.next();
    await blocks.return(undefined);
    throw new ConverterCheckError(
      'unsupported-format',
      channelCount > MAX_CHECK_CHANNELS
        ? `The recording has ${channelCount} channels; a converter check measures at most ${MAX_CHECK_CHANNELS}.`
        : `The recording is at ${rate} Hz; a converter check needs ${MIN_CHECK_RATE_HZ / 1000}–${MAX_CHECK_RATE_HZ / 1000} kHz.`,
    );
  }
  const search = new MarkerSearch(rate, channelCount);
  for await (const block of opened.blocks()) search.push(block.channels, block.frames);
  const totalFrames = opened.framesRead();
  const candidates = search.finish();
  const located = locateSignal(candidates.start, candidates.end, rate, channelCount);
  const layout = checkSignalLayout(channelCount);
  const startMarkerSec = sectionNamed(layout, 'startMarker').startSec;
  const markerLength = markerFrames(rate);

  // Second read: the markers and the measured sections of every channel, placed by the first estimate.
  const radius = search.positionUncertainty + Math.round(MAX_CHANNEL_DELAY_SEC * rate);
  const slack = radius + Math.round(WINDOW_SLACK_SEC * rate);
  const firstClock: SignalClock = { rate, ratio: (markerDistanceSec(channelCount) * rate) / (located.endFrame - located.startFrame), startMarkerSec };
  const around = (frame: number): [number, number] => [frame - radius, frame + markerLength + radius + 1];
  const widened = ([from, to]: [number, number]): [number, number] => [from - slack, Math.min(totalFrames, to + slack)];
  const sectionWindows = MEASURED_SECTIONS.map(([name, limit]) => widened(steadyRange(located.startFrame, firstClock, sectionNamed(layout, name), limit)));
  const capture = new WindowCapture([around(located.startFrame), around(located.endFrame), ...sectionWindows], channelCount);
  const tone = sectionNamed(layout, 'toneMinus1');
  const clips = new ClipCounter([
    widened([located.startFrame, located.endFrame + markerLength]),
    widened(steadyRange(located.startFrame, firstClock, tone, null)),
  ], channelCount);
  await readPass(open(), [capture, clips]);

  const channelIndices = [...Array(channelCount).keys()];
  const { responding, startFrames, endFrames, polarity, markerMatch, markerRatio, lead } = placeChannels(capture.windows, located, radius, rate);
  const spanOf = (c: number): ChannelSpan => ({ windows: capture.windows[c].slice(2), markerFrame: startFrames[c] });

  const { context, written } = sharedMeasures(spanOf(lead), rate, markerRatio, startMarkerSec, layout);
  const channels: ConverterChannelReport[] = channelIndices.map((c) =>
    measureChannel(spanOf(c), context, responding[c], polarity[c], { signal: clips.counts[0][c], fullTone: clips.counts[1][c] }));

  // Delay against channel 1, from the multitone where every channel carries the same signal (the
  // capture windows are the same frames in every channel).
  const multitone = sectionNamed(layout, 'multitone');
  const multitoneWindow = 2 + MEASURED_SECTIONS.findIndex(([name]) => name === 'multitone');
  const [delayFrom] = steadyRange(startFrames[0], context.clock, { ...multitone, startSec: multitone.startSec + DELAY_OFFSET_SEC }, null);
  channels.forEach((channel, c) => {
    if (channel.dead || channels[0].dead) return;
    const reference = capture.windows[0][multitoneWindow];
    const delay = channelDelay(reference.samples, capture.windows[c][multitoneWindow].samples, delayFrom - reference.firstFrame, Math.round(DELAY_SPAN_SEC * rate), startFrames[c] - startFrames[0]);
    // `+ 0` turns the −0 of Math.round(−0.3) into 0.
    channel.delaySamples = c === 0 ? 0 : Math.round(delay) + 0;
  });

  // Third read: the crosstalk tones, one driven channel at a time.
  const crosstalkPaths: CrosstalkPath[] = [];
  const crosstalkSections = sectionsNamed(layout, 'crosstalk');
  if (crosstalkSections.length > 0) {
    const meter = new CrosstalkMeter(
      crosstalkSections.map((section) => {
        const [from, to] = steadyRange(startFrames[lead], context.clock, section, null);
        return { from, to };
      }),
      CROSSTALK_TONES_HZ.map((hz) => (2 * Math.PI * hz * context.clock.ratio) / rate),
      channelCount,
    );
    await readPass(open(), [meter]);
    crosstalkPaths.push(...leakagePaths(meter.amplitudes(), crosstalkSections, channels));
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
      startSec: roundTo(startFrames[lead] / rate, 4),
      endSec: roundTo((endFrames[lead] + markerLength) / rate, 4),
      markerMatch: roundTo(markerMatch, 3),
      writtenSampleRate: written.sampleRate,
      writtenBits: written.bitsPerSample,
    },
    clockErrorPpm: roundTo((context.clock.ratio - 1) * 1e6, 2),
    channels,
    crosstalkDb: crosstalkPaths.length ? Math.max(...crosstalkPaths.flatMap((path) => path.db)) : null,
    crosstalkTonesHz: CROSSTALK_TONES_HZ,
    crosstalkPaths,
    channelGainMismatchDb: liveGains.length > 1 ? roundTo(Math.max(...liveGains) - Math.min(...liveGains), 3) : null,
    interChannelDelaySamples: delays.length ? delays.reduce((worst, delay) => (Math.abs(delay) > Math.abs(worst) ? delay : worst), delays[0]) : null,
    bands: {
      thdnHz: [20, context.bandHigh],
      noiseHz: [20, context.bandHigh],
      passbandHz: [20, roundTo(context.passbandHigh, 1)],
      responseHz: [roundTo(context.design.frequenciesHz[0], 2), roundTo(context.topHz, 1)],
      sinad: 'DC excluded, up to Nyquist (IEEE 1241)',
    },
    findings: [],
  };
  report.findings = judgeConverterCheck(report, options.baseline ?? null, options.thresholds ?? DEFAULT_CONVERTER_THRESHOLDS);
  return report;
}

/**
 * What every channel is measured with: the clock from a four-parameter IEEE 1241 fit of the
 * clearest channel's −1 dB FS tone, the written format from its format tones, and the multitone
 * grid of the written rate.
 */
function sharedMeasures(lead: ChannelSpan, rate: number, markerRatio: number, startMarkerSec: number, layout: CheckSignalLayout): { context: MeasureContext; written: WrittenFormat } {
  const tone = steadyPart(lead, { rate, ratio: markerRatio, startMarkerSec }, sectionNamed(layout, 'toneMinus1'));
  const fitted = fitSine(tone, 0, tone.length, (2 * Math.PI * CHECK_TONE_HZ * markerRatio) / rate, rate);
  const ratio = fitted && fitted.omega > 0 ? (fitted.omega * rate) / (2 * Math.PI * CHECK_TONE_HZ) : markerRatio;
  const clock: SignalClock = { rate, ratio, startMarkerSec };
  const written = identifyWrittenFormat(steadyPart(lead, clock, sectionNamed(layout, 'format')), rate, ratio);
  const writtenRate = written.sampleRate ?? rate;
  return {
    written,
    context: {
      layout,
      clock,
      meter: new BandPowerMeter(rate),
      design: designMultitone(writtenRate),
      topHz: HIGHEST_TONE_FRACTION * Math.min(rate, writtenRate),
      bandHigh: Math.min(20_000, rate / 2),
      passbandHigh: Math.min(20_000, 0.45 * rate, 0.45 * writtenRate),
    },
  };
}
