import { describe, expect, it } from 'vitest';
import { ClippingAnalyzer } from '../../../dsp/analyzers/clipping';
import { formatOf, runAnalyzer } from '../../support/analyzerHarness';
import { ProgrammeGenerator, concat, seededRandom, sine } from '../../support/testSignals';
import { analyzeWavBuffer } from '../../support/wavStreams';
import { encodeSamples, wavFile, type SampleCoding } from '../../support/wavWriter';
import { LINES, VOICES } from '../../../scripts/eval/material';
import { converterBand, resample, speak, synthesise } from '../../../scripts/eval/tools';
import { clipBeforeConverter } from '../../../scripts/eval/faults';
import { voiceTake } from '../../../scripts/eval/varietyMaterial';

const RATE = 48000;
const clipsOfWav = (coding: SampleCoding, channels: Float64Array[], sampleRate = RATE) =>
  analyzeWavBuffer(wavFile({ sampleRate, channels: channels.length, coding }, encodeSamples(channels, coding)), (format) => new ClippingAnalyzer(format));
const clamp = (signal: Float64Array, limit: number) => signal.map((x) => Math.max(-limit, Math.min(limit, x)));

describe('full-scale clipping (runs of >= 3 samples at the top codes) [common practice]', () => {
  it('finds a sine driven 6 dB past full scale in a 16-bit file as one event per passage, with times', async () => {
    const clipped = clamp(sine(997, 2, 0.5, RATE), 1);
    const signal = concat(sine(997, 0.5, 1, RATE), clipped, sine(997, 0.5, 1, RATE), clipped, sine(997, 0.5, 1, RATE));
    const result = await clipsOfWav('pcm16', [signal]);
    expect(result.events).toHaveLength(2);
    expect(result.events.every((event) => event.level === 'fullScale' && event.channel === 0 && event.levelDbfs === 0)).toBe(true);
    expect(result.events[0].startSec).toBeCloseTo(1, 2);
    expect(result.events[0].endSec).toBeCloseTo(1.5, 2);
    expect(result.events[1].startSec).toBeCloseTo(2.5, 2);
    // A 997 Hz sine at +6 dB stays at the rail for 2/3 of each cycle: about 1/3 of 0.5 s each side.
    expect(result.clippedSamples).toBeGreaterThan(0.6 * RATE * 0.5 * 2);
  });

  it('ignores one or two samples at full scale (a legitimate peak)', async () => {
    const signal = sine(997, 0.5, 1, RATE);
    signal[1000] = 1;
    signal[1001] = 1;
    signal[5000] = -1;
    expect((await clipsOfWav('pcm24', [signal])).events).toHaveLength(0);
  });

  it('counts float samples held at full scale, on the right channel; float samples beyond full scale are not clipped', () => {
    const quiet = sine(997, 0.3, 1, RATE);
    const hot = concat(sine(997, 0.3, 0.5, RATE), clamp(sine(997, 1.5, 0.1, RATE), 1), sine(997, 0.3, 0.4, RATE));
    const result = runAnalyzer(new ClippingAnalyzer(formatOf(RATE, 2)), [quiet, hot]);
    expect(result.events).toHaveLength(1);
    expect(result.events[0].channel).toBe(1);
    expect(result.channelClippedSamples[0]).toBe(0);
    // A float stage gained past 1.0 has not clipped (yet): the samples carry the whole waveform.
    const over = concat(sine(997, 0.3, 0.5, RATE), sine(997, 1.5, 0.1, RATE), sine(997, 0.3, 0.4, RATE));
    expect(runAnalyzer(new ClippingAnalyzer(formatOf(RATE, 1)), [over]).events).toEqual([]);
  });
});

describe('flat tops below full scale (analogue clip, then gain lowered): >= 3 flat tops at one level, most peaks there flat [common practice]', () => {
  /** A sine clipped at `clipLevel`, scaled by `gain`, with converter noise (rms `noiseRms`) added after the clip. */
  function analogueClip(frequency: number, seconds: number, clipLevel: number, gain: number, noiseRms: number, seed = 1): Float64Array {
    const random = seededRandom(seed);
    return clamp(sine(frequency, 1, seconds, RATE), clipLevel).map((x) => gain * x + noiseRms * Math.sqrt(3) * (2 * random() - 1));
  }

  it('finds the flat tops, merged into one event, with their level (noise on the flat top tolerated)', async () => {
    // Clip 3 dB down (0.708), then -9 dB of gain: flat tops at 0.708 · 0.355 = -12 dBFS; noise at -110 dBFS rms.
    const gain = 10 ** (-9 / 20);
    const clipLevel = 10 ** (-3 / 20);
    const signal = concat(sine(440, 0.2, 1, RATE), analogueClip(440, 1, clipLevel, gain, 10 ** (-110 / 20)), sine(440, 0.2, 1, RATE));
    const result = await clipsOfWav('pcm24', [signal]);
    expect(result.events).toHaveLength(1);
    const [event] = result.events;
    expect(event.level).toBe('belowFullScale');
    expect(Math.abs(event.levelDbfs - -12)).toBeLessThan(0.05);
    expect(event.startSec).toBeGreaterThan(0.99);
    expect(event.startSec).toBeLessThan(1.01);
    expect(event.endSec).toBeGreaterThan(1.98);
    expect(event.endSec).toBeLessThan(2.01);
  });

  it('finds them in a 16-bit take at -6 dBFS with both polarities', async () => {
    const signal = analogueClip(200, 2, 0.5, 1, 10 ** (-96 / 20), 5);
    const result = await clipsOfWav('pcm16', [signal]);
    expect(result.events.length).toBe(1);
    expect(Math.abs(result.events[0].levelDbfs - -6.02)).toBeLessThan(0.05);
    expect(result.clippedSamples).toBeGreaterThan(RATE);
  });

  it('finds both kinds on one channel: flat tops at -12 dBFS and, later, digital overload at full scale', async () => {
    const gain = 10 ** (-9 / 20);
    const flatTopped = analogueClip(440, 1, 10 ** (-3 / 20), gain, 10 ** (-110 / 20), 7);
    const overloaded = clamp(sine(997, 2, 1, RATE), 1);
    const signal = concat(sine(440, 0.2, 0.5, RATE), flatTopped, sine(440, 0.2, 0.5, RATE), overloaded, sine(440, 0.2, 0.5, RATE));
    const result = await clipsOfWav('pcm24', [signal]);
    const kinds = result.events.map((event) => event.level);
    expect(kinds).toEqual(['belowFullScale', 'fullScale']);
    expect(Math.abs(result.events[0].levelDbfs - -12)).toBeLessThan(0.05);
    expect(result.events[1].startSec).toBeCloseTo(2, 2);
  });

  it('finds flat tops at -20 dBFS, the lowest level examined, with converter noise on them', async () => {
    const gain = 10 ** (-20 / 20) / 0.5;
    const signal = concat(sine(150, 0.05, 1, RATE), analogueClip(150, 1, 0.5, gain, 10 ** (-105 / 20), 8), sine(150, 0.05, 1, RATE));
    const result = await clipsOfWav('pcm24', [signal]);
    expect(result.events).toHaveLength(1);
    expect(Math.abs(result.events[0].levelDbfs - -20)).toBeLessThan(0.05);
    expect(result.events[0].startSec).toBeGreaterThan(0.99);
  });

  it('finds flat tops rippled by the converter\'s anti-alias filter after an analogue clip (sox sinc low-pass at 0.45 fs)', async () => {
    const random = seededRandom(12);
    const voice = speak(LINES[4], VOICES[1], RATE, -10, 0);
    const clipped = clamp(voice.map((x) => x * 10 ** (14 / 20)), 10 ** (-6 / 20)).map((x) => x * 10 ** (-3 / 20));
    const filtered = converterBand(clipped, RATE).map((x) => x + 10 ** (-105 / 20) * (random() - random()));
    const result = await clipsOfWav('pcm24', [filtered]);
    expect(result.events.length).toBeGreaterThan(0);
    expect(result.events.every((event) => event.level === 'belowFullScale' && Math.abs(event.levelDbfs - -9) < 0.5)).toBe(true);
  });

  it('finds rippled flat tops at -20 dBFS on a fast voice whose half-cycles rise fast and fall slowly (es+m2 at 220 wpm, 6 dB past the clip, 3-5 s)', async () => {
    const voice = voiceTake(4, { sampleRate: RATE, peakDbfs: -10, roomToneDbfs: -66, seed: 5 });
    const result = await clipsOfWav('pcm24', [clipBeforeConverter(voice, RATE, 3, 5, -20, 6, -100, 9, true)]);
    expect(result.events.length).toBeGreaterThan(0);
    expect(result.events.every((event) => event.level === 'belowFullScale' && Math.abs(event.levelDbfs - -20) < 0.5 && event.startSec >= 3 && event.endSec <= 5)).toBe(true);
  });

  it('a synthesiser\'s square wave (sox synth square, its plateaus all one length) is not clipping', async () => {
    const square = synthesise(3, ['square', '220'], RATE, 1, ['gain', '-6'])[0];
    expect((await clipsOfWav('pcm24', [square])).events).toEqual([]);
  });

  it('a square-wave melody (sox synth square, eight notes at three levels, two notes in a row at each: plateau lengths change from note to note) is not clipping', async () => {
    const notes = [220, 247, 262, 294, 330, 349, 392, 440];
    const melody = concat(...Array.from({ length: 24 }, (_, k) => synthesise(0.3, ['square', String(notes[(k * 5) % 8])], RATE, 1, ['gain', '-n', String(-6 - (Math.floor(k / 2) % 3))])[0]));
    expect((await clipsOfWav('pcm24', [melody])).events).toEqual([]);
  });

  describe('rounded peaks of voiced speech are not flat tops (espeak-ng speech, levelled and resampled with sox)', () => {
    // Low voices at high rates put several nearly equal samples on every rounded peak; a narrowband
    // voice converted up is smoother still. Peak levels include -20 dBFS, where flat tops start to be examined.
    const line = 'Now the long road winds along the river, and all around the meadow lies a morning calm.';
    it.each([
      [{ name: 'en-us+m7', rate: 140, pitch: 20 }, 96000, -1],
      [{ name: 'en-us+m1', rate: 140, pitch: 20 }, 96000, -3],
      [{ name: 'en-gb+m3', rate: 140, pitch: 20 }, 96000, -3],
      [{ name: 'en-us+m7', rate: 140, pitch: 20 }, 48000, -3],
      [VOICES[2], 96000, -20],
      [VOICES[1], 44100, -1],
    ])('%j at %i Hz, peak %s dBFS, dry', async (voice, sampleRate, peakDbfs) => {
      const speech = speak(line, voice, sampleRate, peakDbfs, 0);
      expect((await clipsOfWav('pcm24', [speech], sampleRate)).events).toEqual([]);
    });

    it('speech made at 8 kHz and converted up to 48 kHz, peak -16.5 dBFS', async () => {
      const speech = resample(speak(LINES[2], VOICES[0], 8000, -16.5), 8000, 48000);
      expect((await clipsOfWav('pcm24', [speech], 48000)).events).toEqual([]);
    });
  });

  describe('clean takes with high peaks report none', () => {
    it.each([997, 100, 50, 20])('a %i Hz sine at -0.1 dBFS (24-bit)', async (frequency) => {
      const result = await clipsOfWav('pcm24', [sine(frequency, 10 ** (-0.1 / 20), 3, RATE, 0.2)]);
      expect(result.events).toEqual([]);
    });

    it('a 50 Hz sine at -0.1 dBFS in 16-bit', async () => {
      expect((await clipsOfWav('pcm16', [sine(50, 10 ** (-0.1 / 20), 3, RATE, 0.2)])).events).toEqual([]);
    });

    it('loud programme-like material and full-band noise', async () => {
      const generator = new ProgrammeGenerator(RATE, 2, 11);
      const programme = [new Float64Array(RATE * 20), new Float64Array(RATE * 20)];
      generator.fill(programme, RATE * 20);
      // Normalise the programme's peak to -0.1 dBFS.
      const peak = Math.max(...programme.map((channel) => channel.reduce((p, x) => Math.max(p, Math.abs(x)), 0)));
      const normalised = programme.map((channel) => channel.map((x) => (x / peak) * 10 ** (-0.1 / 20)));
      expect((await clipsOfWav('pcm24', normalised)).events).toEqual([]);
      const random = seededRandom(9);
      const noise = new Float64Array(RATE * 10).map(() => 0.98 * (2 * random() - 1));
      expect((await clipsOfWav('pcm16', [noise])).events).toEqual([]);
    });
  });
});
