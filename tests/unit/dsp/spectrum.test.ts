import { describe, expect, it } from 'vitest';
import { SpectrumAnalyzer, STANDARD_RATES_HZ } from '@/dsp/analyzers/spectrum';
import {
  addInto, generateWithTool, musicLike, pcmFormat, pinkNoise, processWithTool, pushInBlocks, sine, whiteNoise,
} from '@/tests/support/spectralSignals';

const FS = 48000;

function analyse(channels: Float64Array[], sampleRate = FS, declared = true, options = {}) {
  const frames = channels[0].length;
  const analyzer = new SpectrumAnalyzer(pcmFormat(sampleRate, channels.length, 24, declared ? frames : null), options);
  return pushInBlocks(analyzer, channels, [4096, 1000, 65536, 333]);
}

describe('SpectrumAnalyzer: usable bandwidth', () => {
  it('reads white noise at 48 kHz as reaching Nyquist, with no implied lower source rate', () => {
    const r = analyse([whiteNoise(FS * 4, 0.1, 1), whiteNoise(FS * 4, 0.1, 2)]);
    expect(r.effectiveHz).toBeGreaterThanOrEqual(0.95 * (FS / 2));
    expect(r.impliedSourceRate).toBeNull();
    // White noise has equal density everywhere (its definition): near-Nyquist ≈ passband, ±1 dB.
    expect(Math.abs(r.nearNyquistDb!)).toBeLessThan(1);
    // Nothing rolls off before Nyquist, as in a capture with no decimation filter.
    expect(r.aliasingRisk).toBe(true);
  });

  it('reads pink noise at 48 kHz as reaching Nyquist (a gradual −3 dB/octave slope is not a cut-off)', () => {
    const r = analyse([pinkNoise(FS * 4, 0.1, 3)]);
    expect(r.effectiveHz).toBeGreaterThanOrEqual(0.95 * (FS / 2));
    expect(r.impliedSourceRate).toBeNull();
  });

  it('finds the cut-off of 16 kHz noise up-sampled to 48 kHz by sox: ≈ 8 kHz, source rate 16000', () => {
    // Fixture: sox synthesises white noise at 16 kHz and resamples it to 48 kHz (its default
    // high-quality low-pass). A resampler's low-pass sits just below the original Nyquist
    // (16 kHz wideband speech shows a cut-off at about 7–8 kHz) [common practice].
    const fx = generateWithTool('sox', (out) => ['-r', '16000', '-n', '-b', '24', out, 'synth', '4', 'whitenoise', 'gain', '-10', 'rate', '48000']);
    expect(fx.sampleRate).toBe(48000);
    const r = analyse(fx.channels);
    expect(r.effectiveHz).toBeGreaterThan(7200);
    expect(r.effectiveHz).toBeLessThan(8000);
    expect(r.impliedSourceRate).toBe(16000);
    expect(r.aliasingRisk).toBe(false);
    expect(r.nearNyquistDb!).toBeLessThan(-60);
  });

  it('finds the cut-off of 44.1 kHz noise resampled to 48 kHz by ffmpeg: 20–22.05 kHz, implied rate null', () => {
    // A 44.1 kHz origin cuts off at about 20–22.05 kHz (below its 22.05 kHz Nyquist), ±0.5 kHz, not 24 kHz
    // [common practice]; the report contract
    // leaves impliedSourceRate null because 20–22 kHz is above 0.42 × 48 kHz = 20.16 kHz.
    const fx = generateWithTool('ffmpeg', (out) => [
      '-hide_banner', '-loglevel', 'error', '-y', '-f', 'lavfi', '-i', 'anoisesrc=d=4:c=white:r=44100:a=0.3:seed=7',
      '-af', 'aresample=48000', '-c:a', 'pcm_s24le', out,
    ]);
    const r = analyse(fx.channels);
    expect(r.effectiveHz).toBeGreaterThan(19500);
    expect(r.effectiveHz).toBeLessThanOrEqual(22050 + 500);
    expect(r.impliedSourceRate).toBeNull();
    expect(r.aliasingRisk).toBe(false);
  });

  it('claims 44.1 kHz for noise sox converted from 44.1 to 48 kHz, and 22.05 kHz for noise from 22.05 kHz', () => {
    // sox's default rate keeps 95 % of the old band: −3 dB at about 20.95 kHz, nothing past 22.05 kHz [common practice].
    const from44 = generateWithTool('sox', (out) => ['-r', '44100', '-n', '-b', '24', out, 'synth', '4', 'whitenoise', 'gain', '-10', 'rate', '48000']);
    const r44 = analyse(from44.channels);
    expect(r44.effectiveHz).toBeGreaterThan(20000);
    expect(r44.effectiveHz).toBeLessThan(22050);
    expect(r44.impliedSourceRate).toBe(44100);
    const from22 = generateWithTool('sox', (out) => ['-r', '22050', '-n', '-b', '24', out, 'synth', '4', 'pinknoise', 'gain', '-10', 'rate', '48000']);
    expect(analyse(from22.channels).impliedSourceRate).toBe(22050);
  });

  it('claims no source rate for native 48 kHz content flat within 6 dB from 12 to 21.5 kHz (its own converter\'s cut-off)', () => {
    // Converter pass bands end at about 0.45 fs (21.6 kHz at 48 kHz) [common practice]: sox's low-pass at 22 kHz stands in for one.
    const native = generateWithTool('sox', (out) => ['-n', '-r', '48000', '-b', '24', out, 'synth', '4', 'whitenoise', 'gain', '-10', 'sinc', '-22000']);
    const r = analyse(native.channels);
    const flat = r.spectrum.db.filter((_, i) => r.spectrum.hz[i] >= 12000 && r.spectrum.hz[i] <= 21500);
    expect(Math.max(...flat) - Math.min(...flat)).toBeLessThan(6);
    expect(r.impliedSourceRate).toBeNull();
    expect(r.effectiveHz).toBeGreaterThan(21500);
  });

  it('makes no bandwidth claim on a tone-only take (no broadband content)', () => {
    const r = analyse([addInto(sine(FS * 4, FS, 1000, 0.125), whiteNoise(FS * 4, 1e-5, 3))]);
    expect(r.effectiveHz).toBeNull();
    expect(r.impliedSourceRate).toBeNull();
    expect(r.aliasingRisk).toBe(false);
  });

  it('finds the cut-off of 16 kHz noise up-sampled by ffmpeg\'s default (soft) resampler: below 8 kHz, source rate 16000', () => {
    // ffmpeg's default low-pass lets the band edge run on past 8 kHz; its half-power point stays below it.
    const fx = generateWithTool('ffmpeg', (out) => [
      '-hide_banner', '-loglevel', 'error', '-y', '-f', 'lavfi', '-i', 'anoisesrc=d=4:c=white:r=16000:a=0.3:seed=3',
      '-af', 'aresample=48000', '-c:a', 'pcm_s24le', out,
    ]);
    const r = analyse(fx.channels);
    expect(r.effectiveHz).toBeGreaterThan(7200);
    expect(r.effectiveHz).toBeLessThan(8000);
    expect(r.impliedSourceRate).toBe(16000);
  });

  it('reports 8 kHz-origin telephony content (sox) as implied rate 8000', () => {
    const fx = generateWithTool('sox', (out) => ['-r', '8000', '-n', '-b', '24', out, 'synth', '3', 'pinknoise', 'gain', '-10', 'rate', '48000']);
    const r = analyse(fx.channels);
    expect(r.effectiveHz).toBeGreaterThan(3400);
    expect(r.effectiveHz).toBeLessThan(4000);
    expect(r.impliedSourceRate).toBe(8000);
  });

  it('reads music-like content at 48 kHz near Nyquist, and the same content through sox at 16 kHz as ≈ 8 kHz / 16000', () => {
    const music = musicLike(FS * 6, FS, 0.5, 31);
    const full = analyse([music]);
    expect(full.effectiveHz).toBeGreaterThanOrEqual(0.9 * (FS / 2));
    expect(full.impliedSourceRate).toBeNull();
    // Fixture: sox resamples the same samples down to 16 kHz and back up to 48 kHz.
    const narrow = processWithTool([music], FS, (inFile, outFile) => [inFile, '-b', '24', outFile, 'rate', '16000', 'rate', '48000']);
    const r = analyse(narrow.channels);
    // Music slopes down towards the cut-off, so its half-power point sits a little lower than noise's.
    expect(r.effectiveHz).toBeGreaterThan(6800);
    expect(r.effectiveHz).toBeLessThan(8000);
    expect(r.impliedSourceRate).toBe(16000);
  });

  it('gives the same answer whether or not the header declares the length (adaptive window spacing)', () => {
    const fx = generateWithTool('sox', (out) => ['-r', '16000', '-n', '-b', '24', out, 'synth', '6', 'whitenoise', 'gain', '-10', 'rate', '48000']);
    const known = analyse(fx.channels, FS, true, { maxWindows: 20 });
    const unknown = analyse(fx.channels, FS, false, { maxWindows: 20 });
    expect(unknown.impliedSourceRate).toBe(16000);
    expect(Math.abs(unknown.effectiveHz! - known.effectiveHz!)).toBeLessThan(150);
  });

  it('picks the lowest standard rate whose Nyquist lies above the cut-off (report contract list)', () => {
    // Independent check of the rate rule on a 32 kHz-origin fixture (sox): cut-off ≈ 15–16 kHz → 32000.
    const fx = generateWithTool('sox', (out) => ['-r', '32000', '-n', '-b', '24', out, 'synth', '3', 'whitenoise', 'gain', '-10', 'rate', '48000']);
    const r = analyse(fx.channels);
    expect(r.effectiveHz).toBeGreaterThan(14500);
    expect(r.effectiveHz).toBeLessThan(16000);
    const expected = STANDARD_RATES_HZ.find((rate) => rate / 2 > r.effectiveHz!);
    expect(expected).toBe(32000);
    expect(r.impliedSourceRate).toBe(32000);
  });
});

describe('SpectrumAnalyzer: spectral lines and aliasing', () => {
  it('shows a 30 kHz tone sampled at 48 kHz at its alias 18 kHz (textbook f_a = |f − k·fs|)', () => {
    // Textbook alias formula, k = round(30000/48000) = 1 → |30000 − 48000| = 18000 Hz.
    const tone = sine(FS * 2, FS, 30000, 0.5);
    addInto(tone, whiteNoise(FS * 2, 1e-4, 9));
    const r = analyse([tone]);
    const bin = FS / 8192;
    expect(Math.abs(r.peakHz! - 18000)).toBeLessThan(bin / 2);
    // The plotted point nearest 18 kHz is the spectrum's maximum.
    const iMax = r.spectrum.db.indexOf(Math.max(...r.spectrum.db));
    const ratio = r.spectrum.hz[1] / r.spectrum.hz[0];
    expect(Math.abs(Math.log(r.spectrum.hz[iMax] / 18000))).toBeLessThan(Math.log(ratio));
  });

  it('also folds 25 kHz at 44.1 kHz to |25000 − 44100| = 19.1 kHz (same formula)', () => {
    const fs = 44100;
    const r = analyse([addInto(sine(fs * 2, fs, 25000, 0.5), whiteNoise(fs * 2, 1e-4, 10))], fs);
    expect(Math.abs(r.peakHz! - 19100)).toBeLessThan(fs / 8192 / 2);
  });

  it('plots a few hundred log-spaced points from 20 Hz to Nyquist', () => {
    const r = analyse([whiteNoise(FS * 4, 0.1, 4)]);
    expect(r.spectrum.hz.length).toBe(240);
    expect(r.spectrum.hz[0]).toBeGreaterThan(19);
    expect(r.spectrum.hz[239]).toBeLessThanOrEqual(24000);
    const ratios = r.spectrum.hz.slice(1).map((f, i) => f / r.spectrum.hz[i]);
    expect(Math.max(...ratios) - Math.min(...ratios)).toBeLessThan(0.01);
    // White noise: the plot is flat relative to the passband to within the estimate's scatter.
    const upper = r.spectrum.db.filter((_, i) => r.spectrum.hz[i] > 1000);
    expect(Math.max(...upper.map(Math.abs))).toBeLessThan(1.5);
  });

  it('returns nulls for digital silence', () => {
    const r = analyse([new Float64Array(FS)]);
    expect(r.effectiveHz).toBeNull();
    expect(r.impliedSourceRate).toBeNull();
    expect(r.aliasingRisk).toBe(false);
  });

  it('handles a take shorter than one FFT window', () => {
    const r = analyse([whiteNoise(3000, 0.1, 5)]);
    expect(r.effectiveHz).toBeGreaterThan(0.9 * (FS / 2));
  });
});

describe('SpectrumAnalyzer: configuration', () => {
  it('rejects impossible configuration with a message', () => {
    expect(() => new SpectrumAnalyzer(pcmFormat(0, 2))).toThrow(/sample rate/);
    expect(() => new SpectrumAnalyzer(pcmFormat(Number.NaN, 2))).toThrow(/sample rate/);
    expect(() => new SpectrumAnalyzer(pcmFormat(48000, 0))).toThrow(/channel count/);
    expect(() => new SpectrumAnalyzer(pcmFormat(48000, 2), { fftSize: 5000 })).toThrow(/power of two/);
    expect(() => new SpectrumAnalyzer(pcmFormat(48000, 2), { maxWindows: 0 })).toThrow(/maxWindows/);
    expect(() => new SpectrumAnalyzer(pcmFormat(48000, 2), { plotPoints: 3 })).toThrow(/plotPoints/);
  });

  it('refuses to be used after finish()', () => {
    const a = new SpectrumAnalyzer(pcmFormat(48000, 1));
    a.finish();
    expect(() => a.finish()).toThrow(/twice/);
  });
});
