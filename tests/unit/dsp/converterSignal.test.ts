import { execFileSync } from 'node:child_process';
import { afterAll, describe, expect, it } from 'vitest';
import { CHECK_TONE_HZ, checkSignalLayout, sectionNamed } from '../../../dsp/converter/checkSignal';
import { checkSignalWav, checkSignalWavStream, type CheckSignalFormat } from '../../../dsp/converter/signalWriter';
import { tempDirectory } from '../../support/tempFiles';
import { decodeWav } from '../../support/wavStreams';

const temp = tempDirectory();
afterAll(() => temp.remove());

/** sox's own reading of a file's header (an outside reader). */
const soxInfo = (path: string) => ({
  rate: Number(execFileSync('sox', ['--i', '-r', path], { encoding: 'utf8' })),
  channels: Number(execFileSync('sox', ['--i', '-c', path], { encoding: 'utf8' })),
  bits: Number(execFileSync('sox', ['--i', '-b', path], { encoding: 'utf8' })),
  seconds: Number(execFileSync('sox', ['--i', '-D', path], { encoding: 'utf8' })),
});

const peakDbfs = (x: Float64Array, from: number, to: number) => {
  let peak = 0;
  for (let n = from; n < to; n++) peak = Math.max(peak, Math.abs(x[n]));
  return 20 * Math.log10(peak);
};

describe('converter check signal', () => {
  it('stays well under two minutes for every channel count it supports', () => {
    expect(checkSignalLayout(1).durationSec).toBeLessThan(30);
    expect(checkSignalLayout(2).durationSec).toBeLessThan(30);
    expect(checkSignalLayout(16).durationSec).toBeLessThan(60);
    expect(() => checkSignalLayout(17)).toThrow(/1 to 16 channels/);
  });

  it.each<CheckSignalFormat>([
    { sampleRate: 44100, bitsPerSample: 16, channels: 1 },
    { sampleRate: 96000, bitsPerSample: 24, channels: 2 },
    { sampleRate: 48000, bitsPerSample: 32, channels: 6 },
  ])('is a WAV file sox reads as asked: $sampleRate Hz, $bitsPerSample-bit, $channels ch', (format) => {
    const path = temp.write(`signal-${format.sampleRate}-${format.bitsPerSample}-${format.channels}.wav`, checkSignalWav(format));
    const info = soxInfo(path);
    expect(info).toMatchObject({ rate: format.sampleRate, channels: format.channels, bits: format.bitsPerSample });
    expect(info.seconds).toBeCloseTo(checkSignalLayout(format.channels).durationSec, 3);
  });

  it('announces itself quietly before it gets loud', async () => {
    const rate = 48000;
    const { channels } = await decodeWav(checkSignalWav({ sampleRate: rate, bitsPerSample: 24, channels: 2 }), 1 << 20);
    const layout = checkSignalLayout(2);
    const loudFrom = Math.round(sectionNamed(layout, 'startMarker').startSec * rate);
    expect(peakDbfs(channels[0], 0, Math.round(0.3 * rate))).toBeLessThan(-40);
    expect(peakDbfs(channels[0], 0, loudFrom)).toBeLessThan(-17);
    expect(peakDbfs(channels[0], loudFrom, channels[0].length)).toBeGreaterThan(-1.1);
    // Never at full scale: the loudest part is the −1 dB FS tone.
    expect(peakDbfs(channels[0], 0, channels[0].length)).toBeLessThan(-0.9);
  });

  it('streams the same bytes it writes to a buffer', async () => {
    const format: CheckSignalFormat = { sampleRate: 32000, bitsPerSample: 16, channels: 1 };
    const chunks: Buffer[] = [];
    for await (const chunk of checkSignalWavStream(format)) chunks.push(chunk as Buffer);
    expect(Buffer.concat(chunks).equals(checkSignalWav(format))).toBe(true);
  });

  it('refuses formats it cannot write, in words', () => {
    expect(() => checkSignalWav({ sampleRate: 8000, bitsPerSample: 16, channels: 1 })).toThrow(/32000 to 192000 Hz/);
    expect(() => checkSignalWav({ sampleRate: 48000, bitsPerSample: 20 as 16, channels: 1 })).toThrow(/16-, 24- or 32-bit/);
  });

  // Lipshitz, Wannamaker & Vanderkooy, "Quantization and Dither: A Theoretical Survey", JAES 1992:
  // TPDF dither of 2 LSB peak to peak adds Q²/6 to the rounding error's Q²/12, total Q²/4 (+4.77 dB),
  // and leaves the error independent of the signal (no harmonics).
  it('dithers the 16-bit −60 dB FS tone with TPDF: Q²/4 of noise and no truncation harmonics', async () => {
    const rate = 48000;
    const layout = checkSignalLayout(1);
    const section = sectionNamed(layout, 'toneMinus60');
    const first = Math.round(section.startSec * rate);
    const from = first + Math.round(0.1 * rate);
    const length = 2 * rate;
    const amplitude = 10 ** (-60 / 20);
    const q = 2 ** -15;
    const errorOf = async (dither: boolean) => {
      const { channels } = await decodeWav(checkSignalWav({ sampleRate: rate, bitsPerSample: 16, channels: 1 }, { dither }), 1 << 20);
      const error = new Float64Array(length);
      for (let i = 0; i < length; i++) error[i] = channels[0][from + i] - amplitude * Math.sin((2 * Math.PI * CHECK_TONE_HZ * (from + i - first)) / rate);
      return error;
    };
    /** Amplitude of the error's component at a harmonic of 997 Hz (correlation with cos and sin). */
    const harmonic = (error: Float64Array, k: number) => {
      let c = 0;
      let s = 0;
      for (let i = 0; i < error.length; i++) {
        const phase = (2 * Math.PI * k * CHECK_TONE_HZ * (from + i - first)) / rate;
        c += error[i] * Math.cos(phase);
        s += error[i] * Math.sin(phase);
      }
      return (2 * Math.hypot(c, s)) / error.length;
    };
    const meanSquare = (x: Float64Array) => x.reduce((sum, v) => sum + v * v, 0) / x.length;
    const dithered = await errorOf(true);
    const plain = await errorOf(false);
    expect(10 * Math.log10(meanSquare(dithered) / (q * q / 4))).toBeCloseTo(0, 1);
    /** Power of harmonics 2–20 of the error, relative to the rounding error's Q²/12. */
    const harmonicPower = (error: Float64Array) => Array.from({ length: 19 }, (_, i) => harmonic(error, i + 2) ** 2 / 2).reduce((a, b) => a + b) / (q * q / 12);
    // Rounding a 33-LSB sine puts a twentieth of its error power into odd harmonics (about 0.03 LSB
    // each); with TPDF what the harmonics' correlations pick up is noise (about −30 dB in 2 s).
    expect(10 * Math.log10(harmonicPower(plain))).toBeGreaterThan(-15);
    expect(10 * Math.log10(harmonicPower(dithered))).toBeLessThan(-25);
  });
});
