import { describe, expect, it } from 'vitest';
import { LevelsAnalyzer } from '../../../dsp/analyzers/levels';
import { formatOf, runAnalyzer } from '../../support/analyzerHarness';
import { seededRandom, sine } from '../../support/testSignals';
import { analyzeWavBuffer, decodeWav } from '../../support/wavStreams';
import { encodeSamples, wavFile, type SampleCoding } from '../../support/wavWriter';

const RATE = 48000;
const dbPower = (meanSquare: number) => 10 * Math.log10(meanSquare);
const levelsOfWav = (coding: SampleCoding, channels: Float64Array[], extras: { extensibleMask?: number; validBits?: number } = {}) =>
  analyzeWavBuffer(wavFile({ sampleRate: RATE, channels: channels.length, coding, ...extras }, encodeSamples(channels, coding)), (format) => new LevelsAnalyzer(format));

describe('levels', () => {
  // Report contract: RMS re a full-scale square wave (convention A in Reiss & McPherson, Audio Effects, 2014), so a full-scale sine reads -3.01 dBFS.
  it('reads a full-scale sine at 0 dBFS peak and -3.01 dBFS RMS', () => {
    const [channel] = runAnalyzer(new LevelsAnalyzer(formatOf(RATE, 1)), [sine(997, 1, 2, RATE, 0.3)]).channels;
    expect(20 * Math.log10(channel.samplePeak)).toBeCloseTo(0, 3);
    expect(dbPower(channel.meanSquare)).toBeCloseTo(-3.0103, 3);
  });

  it('measures DC offset as the mean sample value', () => {
    const signal = sine(100, 0.5, 1, RATE).map((x) => x + 0.01);
    const [channel] = runAnalyzer(new LevelsAnalyzer(formatOf(RATE, 1)), [signal]).channels;
    expect(channel.dcOffset).toBeCloseTo(0.01, 6);
    expect(channel.silent).toBe(false);
  });

  it('marks a dead channel as silent (all zero, or only 16-bit dither and a DC offset)', () => {
    const random = seededRandom(3);
    const dither = new Float64Array(RATE).map(() => 0.002 + (random() - random()) / 32768);
    const { channels } = runAnalyzer(new LevelsAnalyzer(formatOf(RATE, 3)), [sine(997, 0.1, 1, RATE), new Float64Array(RATE), dither]);
    expect(channels.map((channel) => channel.silent)).toEqual([false, true, true]);
    expect(channels[1].effectiveBits).toBe(0);
  });
});

describe('steady DC offset: the mean of the quietest 100 ms windows, net of their scatter [common practice]', () => {
  /** Speech-like bursts of an asymmetric waveform (a mean while it sounds) with pauses of room noise. */
  function asymmetricBursts(offset: number, seed: number): Float64Array {
    const random = seededRandom(seed);
    return new Float64Array(RATE * 8).map((_, i) => {
      const voiced = Math.floor(i / (0.6 * RATE)) % 2 === 0;
      const wave = 0.3 * Math.max(0, Math.sin((2 * Math.PI * 120 * i) / RATE)) ** 3;
      return (voiced ? wave : 0) + 3e-4 * (random() - random()) + offset;
    });
  }

  it('reads no steady offset in an asymmetric waveform whose mean comes and goes with the sound', () => {
    const [channel] = runAnalyzer(new LevelsAnalyzer(formatOf(RATE, 1)), [asymmetricBursts(0, 1)]).channels;
    expect(channel.dcOffset).toBeGreaterThan(0.01);
    expect(channel.steadyDcOffset).toBe(0);
  });

  it('reads a converter offset that is there all the time, within 5 %', () => {
    const [channel] = runAnalyzer(new LevelsAnalyzer(formatOf(RATE, 1)), [asymmetricBursts(-0.003, 2)]).channels;
    expect(Math.abs(channel.steadyDcOffset - -0.003)).toBeLessThan(0.00015);
  });
});

describe('dead channels: no signal, or only a steady noise [common practice]', () => {
  const hiss = (dbfs: number, seed: number, seconds = 4) => {
    const random = seededRandom(seed);
    return new Float64Array(RATE * seconds).map(() => 10 ** (dbfs / 20) * Math.sqrt(6) * (random() - random()));
  };
  const programme = (seed: number) => {
    const random = seededRandom(seed);
    return new Float64Array(RATE * 4).map((_, i) => (0.2 + 0.2 * Math.sin(i / 9000)) * Math.sin(i / 7) * (Math.floor(i / 20000) % 3 === 0 ? 0.01 : 1) + 1e-4 * random());
  };

  it('marks open inputs dead: hiss at -90 dBFS (no signal), at -84 dBFS, and 30 dB under a live channel (noise only)', () => {
    const { channels } = runAnalyzer(new LevelsAnalyzer(formatOf(RATE, 4)), [programme(1), hiss(-90.5, 2), hiss(-84, 3), hiss(-60, 4)]);
    expect(channels.map((channel) => channel.silentKind)).toEqual([null, 'no-signal', 'noise-only', 'noise-only']);
    expect(channels.map((channel) => channel.silent)).toEqual([false, true, true, true]);
  });

  it('leaves steady material that is the programme alone: room tone on its own, ambience on every channel', () => {
    expect(runAnalyzer(new LevelsAnalyzer(formatOf(RATE, 1)), [hiss(-63, 4)]).channels[0].silent).toBe(false);
    expect(runAnalyzer(new LevelsAnalyzer(formatOf(RATE, 2)), [hiss(-30, 5), hiss(-31, 6)]).channels.map((channel) => channel.silent)).toEqual([false, false]);
  });

  // Pink noise (-3 dB per octave) stands in for a quiet atmosphere: acoustic ambience is dominated by low
  // frequencies, an amplifier's hiss is white [textbook]. Pink by the Voss-McCartney sum of held random rows.
  const pink = (dbfs: number, seed: number) => {
    const random = seededRandom(seed);
    const rows = new Float64Array(16);
    const out = new Float64Array(RATE * 4).map((_, i) => {
      for (let row = 0; row < rows.length; row++) if (i % 2 ** row === 0) rows[row] = random() - 0.5;
      return rows.reduce((sum, value) => sum + value, 0);
    });
    const rms = Math.sqrt(out.reduce((sum, x) => sum + x * x, 0) / out.length);
    return out.map((x) => (x * 10 ** (dbfs / 20)) / rms);
  };

  it('a quiet atmosphere 40 dB under the programme (the surrounds of a drama mix) is programme; white hiss at that level is an open input', () => {
    const { channels } = runAnalyzer(new LevelsAnalyzer(formatOf(RATE, 3)), [programme(1), pink(-58, 7), hiss(-58, 8)]);
    expect(channels.map((channel) => channel.silentKind)).toEqual([null, null, 'noise-only']);
    expect(channels[1].highShare).toBeLessThan(0.5);
    expect(channels[2].highShare).toBeGreaterThan(0.75);
  });
});

describe('float samples beyond full scale', () => {
  it('counts them per channel with the first frame', () => {
    const signal = sine(997, 0.5, 1, RATE);
    signal.fill(1.5, 1000, 1010);
    const { channels } = runAnalyzer(new LevelsAnalyzer(formatOf(RATE, 2)), [sine(997, 0.5, 1, RATE), signal]);
    expect(channels.map((channel) => channel.overFullScaleSamples)).toEqual([0, 10]);
    expect(channels[1].firstOverFullScaleFrame).toBe(1000);
  });
});

describe('effective bits (OR of integer codes, trailing zeros)', () => {
  const tone = sine(997, 0.5, 0.5, RATE, 0.1);
  const quantise = (signal: Float64Array, bits: number) => signal.map((x) => Math.round(x * 2 ** (bits - 1)) / 2 ** (bits - 1));

  it('reads 24 for real 24-bit audio and 16 for 16-bit audio in a 24-bit container', async () => {
    expect((await levelsOfWav('pcm24', [tone])).channels[0].effectiveBits).toBe(24);
    expect((await levelsOfWav('pcm24', [quantise(tone, 16)])).channels[0].effectiveBits).toBe(16);
  });

  it('reads 20 for 20-bit audio declared as 20 valid bits in WAVE_FORMAT_EXTENSIBLE', async () => {
    const result = await levelsOfWav('pcm24', [quantise(tone, 20)], { extensibleMask: 0x4, validBits: 20 });
    expect(result.channels[0].effectiveBits).toBe(20);
  });

  it('reads 16 and 24 for float files holding 16- and 24-bit values, 32 for true float audio', async () => {
    expect((await levelsOfWav('float32', [quantise(tone, 16)])).channels[0].effectiveBits).toBe(16);
    expect((await levelsOfWav('float32', [quantise(tone, 24)])).channels[0].effectiveBits).toBe(24);
    expect((await levelsOfWav('float32', [tone.map((x) => x * 0.987654321)])).channels[0].effectiveBits).toBe(32);
    expect((await levelsOfWav('float64', [quantise(tone, 16)])).channels[0].effectiveBits).toBe(16);
  });

  it('reads 8 for 8-bit PCM and 32 for real 32-bit PCM', async () => {
    expect((await levelsOfWav('pcm8', [tone])).channels[0].effectiveBits).toBe(8);
    expect((await levelsOfWav('pcm32', [tone])).channels[0].effectiveBits).toBe(32);
  });
});

describe('ideal quantiser SNR = 6.02·N + 1.76 dB (textbook; e.g. Analog Devices MT-001)', () => {
  // A full-scale 997 Hz sine quantised to N bits, read back through the reader:
  // the error power relative to the sine's power is the quantisation SNR.
  it.each([
    [8, 'pcm8' as const],
    [16, 'pcm16' as const],
    [24, 'pcm24' as const],
  ])('%i-bit: within 0.1 dB of 6.02N + 1.76', async (bits, coding) => {
    // Amplitude one LSB under full scale keeps the positive peak codable.
    const amplitude = 1 - 2 ** (1 - bits);
    const ideal = sine(997, amplitude, 10, RATE, 0.123);
    const decoded = (await decodeWav(wavFile({ sampleRate: RATE, channels: 1, coding }, encodeSamples([ideal], coding)), 65537)).channels[0];
    let signalPower = 0, errorPower = 0;
    for (let n = 0; n < ideal.length; n++) {
      signalPower += ideal[n] * ideal[n];
      errorPower += (decoded[n] - ideal[n]) ** 2;
    }
    const snr = 10 * Math.log10(signalPower / errorPower);
    expect(Math.abs(snr - (6.02 * bits + 1.76))).toBeLessThan(0.1);
  });

});
