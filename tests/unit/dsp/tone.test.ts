import { describe, expect, it } from 'vitest';
import { likelyRecordedRate, ToneAnalyzer } from '@/dsp/analyzers/tone';
import {
  addInto, generateWithTool, pcmFormat, pushInBlocks, quantise, sine, speechLike, whiteNoise,
} from '@/tests/support/spectralSignals';

const FS = 48000;

function analyse(channels: Float64Array[], sampleRate = FS, options = {}, declared = true) {
  const frames = channels[0].length;
  return pushInBlocks(new ToneAnalyzer(pcmFormat(sampleRate, channels.length, 24, declared ? frames : null), options), channels, [65536, 1234, 8192]);
}

function concat(...parts: Float64Array[]): Float64Array {
  const out = new Float64Array(parts.reduce((n, p) => n + p.length, 0));
  let o = 0;
  for (const p of parts) {
    out.set(p, o);
    o += p.length;
  }
  return out;
}

describe('ToneAnalyzer: SINAD and ENOB (IEEE Std 1241 definitions [from memory])', () => {
  const fullScale = 1 - 2 ** -15; // largest positive 16-bit code

  it('ideal 16-bit full-scale 997 Hz sine, undithered: SINAD ≈ 98.1 dB, ENOB ≈ 16.0', () => {
    // Ideal quantiser SNR = 6.02·16 + 1.76 = 98.09 dB (textbook ideal quantiser, e.g. Analog Devices MT-001); the error
    // of a real 16-bit quantiser on a 997 Hz tone at 48 kHz is close to that uniform model.
    const x = quantise(sine(FS * 3, FS, 997, fullScale, 0.1), 16);
    const r = analyse([x])!;
    expect(r).not.toBeNull();
    expect(Math.abs(r.sinadDb - 98.1)).toBeLessThan(0.15);
    expect(r.thdnDb).toBe(-r.sinadDb);
    expect(Math.abs(r.enobBits - 16.0)).toBeLessThan(0.05);
    expect(Math.abs(r.frequencyHz - 997)).toBeLessThan(0.001);
    expect(Math.abs(r.levelDbfs)).toBeLessThan(0.01);
    expect(r.startSec).toBe(0);
    expect(r.endSec).toBeCloseTo(3, 2);
  });

  it('the same with 2 LSB p-p TPDF dither: SINAD ≈ 93.3 dB, ENOB ≈ 15.2', () => {
    // TPDF dither adds Q²/6 to the Q²/12 of quantisation: a 4.77 dB penalty (Lipshitz, Wannamaker & Vanderkooy,
    // JAES 1992 [from memory]): 98.09 − 4.77 = 93.32 dB, ENOB (93.32 − 1.76)/6.02 = 15.21.
    const x = quantise(sine(FS * 4, FS, 997, 0.999, 0.2), 16, 77);
    const r = analyse([x])!;
    expect(Math.abs(r.sinadDb - 93.31)).toBeLessThan(0.1);
    expect(Math.abs(r.enobBits - 15.21)).toBeLessThan(0.03);
  });

  it('refers ENOB to full scale for a tone below it: (SINAD − 1.76 + 20·log10(FS/peak))/6.02', () => {
    // A −20 dBFS tone through the same ideal 16-bit quantiser: the noise is the same, so SINAD drops
    // by ≈ 20 dB but full-scale-referred ENOB stays ≈ 16 (IEEE 1241 full-scale form [from memory]).
    const x = quantise(sine(FS * 3, FS, 997, 0.1, 0.3), 16, 78);
    const r = analyse([x])!;
    expect(Math.abs(r.levelDbfs + 20)).toBeLessThan(0.01);
    expect(Math.abs(r.sinadDb - (93.31 - 20))).toBeLessThan(0.2);
    expect(Math.abs(r.enobBits - 15.21)).toBeLessThan(0.05);
  });

  it('reads a −40 dB third harmonic as SINAD 40 dB (SINAD = rms signal / rms NAD)', () => {
    const x = addInto(sine(FS * 2, FS, 1000, 0.5), sine(FS * 2, FS, 3000, 0.005));
    const r = analyse([x])!;
    expect(Math.abs(r.sinadDb - 40)).toBeLessThan(0.01);
  });
});

describe('ToneAnalyzer: what is not a measurable line-up tone', () => {
  it('caps SINAD and ENOB of an fs/4 sine in a 24-bit file at the container limit, and says so', () => {
    // 12 kHz at 48 kHz lands on the same four codes every period: the fit leaves no residual at all.
    // The ideal N-bit quantiser's limit (IEEE 1241; 6.02·N + 1.76 dB for a full-scale sine) is the most
    // such a file can show: 146.09 dB + 20·log10(0.5) = 140.07 dB, ENOB 24.
    const x = quantise(sine(FS * 3, FS, 12000, 0.5, 0.4), 24);
    const r = analyse([x])!;
    expect(r.limitedByContainer).toBe(true);
    expect(Math.abs(r.sinadDb - (6.0206 * 24 + 1.7609 + 20 * Math.log10(0.5)))).toBeLessThan(0.05);
    expect(r.enobBits).toBeLessThanOrEqual(24);
    expect(Math.abs(r.enobBits - 24)).toBeLessThan(0.02);
    // A 997 Hz tone with real noise is measured, not capped.
    expect(analyse([quantise(sine(FS * 3, FS, 997, 0.5, 0.1), 16)])!.limitedByContainer).toBe(false);
  });

  it('reports no tone on sox sine sweeps from 20 Hz to 20 kHz (a Debian reference tool), at 48 and 44.1 kHz', () => {
    // The slow start of the 20-20000 sweep looks steady for about 2 s: fitted as one sine it leaves a SINAD near -13 dB.
    for (const [rate, sweep] of [[48000, '20-20000'], [44100, '20-20000'], [48000, '20:20000']] as const) {
      const fx = generateWithTool('sox', (out) => ['-n', '-r', String(rate), '-b', '24', out, 'synth', '20', 'sine', sweep, 'vol', '0.5']);
      expect(analyse(fx.channels, rate)).toBeNull();
    }
  });
});

describe('ToneAnalyzer: finding the tone', () => {
  it('finds a 1 kHz −18 dBFS line-up tone at the start followed by programme', () => {
    const amp = 10 ** (-18 / 20);
    const tone = sine(FS * 3, FS, 1000, amp);
    const take = concat(tone, speechLike(FS * 8, FS, 0.3, 5));
    addInto(take, whiteNoise(take.length, 10 ** (-80 / 20), 6));
    const r = analyse([take, take.slice()])!;
    expect(r).not.toBeNull();
    expect(r.startSec).toBe(0);
    expect(Math.abs(r.endSec - 3)).toBeLessThan(0.01);
    expect(Math.abs(r.frequencyHz - 1000)).toBeLessThan(0.1);
    expect(Math.abs(r.levelDbfs + 18)).toBeLessThan(0.05);
    // Noise −80 dBFS RMS against a −21 dBFS RMS tone: SINAD ≈ 59 dB.
    expect(Math.abs(r.sinadDb - 59)).toBeLessThan(0.5);
    expect(r.likelyRecordedRate).toBeNull();
  });

  it('measures an odd frequency to well under 0.1 Hz (four-parameter fit)', () => {
    const x = addInto(sine(FS * 2, FS, 1234.567, 0.25, 1), whiteNoise(FS * 2, 1e-4, 7));
    const r = analyse([x])!;
    expect(Math.abs(r.frequencyHz - 1234.567)).toBeLessThan(0.01);
  });

  it('finds a tone after a short pre-roll of silence and places its start', () => {
    const take = concat(new Float64Array(FS * 1.5), sine(FS * 2, FS, 997, 0.1), speechLike(FS * 4, FS, 0.3, 8));
    const r = analyse([take])!;
    expect(Math.abs(r.startSec - 1.5)).toBeLessThan(0.01);
    expect(Math.abs(r.endSec - 3.5)).toBeLessThan(0.01);
  });

  it('finds a tone at the end of a long take from the tail ring, declared length or not', () => {
    const take = concat(speechLike(FS * 20, FS, 0.3, 9), sine(FS * 2, FS, 997, 0.2));
    for (const declared of [true, false]) {
      const r = analyse([take], FS, {}, declared)!;
      expect(r).not.toBeNull();
      expect(Math.abs(r.startSec - 20)).toBeLessThan(0.01);
      expect(Math.abs(r.endSec - 22)).toBeLessThan(0.01);
      expect(Math.abs(r.frequencyHz - 997)).toBeLessThan(0.01);
    }
  });

  it('still finds the end tone of a take up to a minute shorter than its header declares', () => {
    const take = concat(speechLike(FS * 20, FS, 0.3, 18), sine(FS * 2, FS, 997, 0.2));
    const analyzer = new ToneAnalyzer(pcmFormat(FS, 1, 24, take.length + FS * 50));
    const r = pushInBlocks(analyzer, [take], 65536)!;
    expect(Math.abs(r.endSec - 22)).toBeLessThan(0.01);
  });

  it('follows a tone that runs past the kept head', () => {
    const take = concat(sine(FS * 7, FS, 1000, 0.2), whiteNoise(FS * 2, 0.05, 10));
    const r = analyse([take], FS, { headSec: 3 })!;
    expect(r.startSec).toBe(0);
    expect(Math.abs(r.endSec - 7)).toBeLessThan(0.01);
  });

  it('reports no tone for programme, noise, or a tone that starts long after the head', () => {
    expect(analyse([speechLike(FS * 6, FS, 0.3, 11)])).toBeNull();
    expect(analyse([whiteNoise(FS * 6, 0.1, 12)])).toBeNull();
    const late = concat(speechLike(FS * 6, FS, 0.3, 13), sine(FS * 2, FS, 1000, 0.2), speechLike(FS * 16, FS, 0.3, 14));
    expect(analyse([late])).toBeNull();
  });

  it('ignores a tone shorter than the minimum', () => {
    const take = concat(sine(FS * 0.5, FS, 1000, 0.2), speechLike(FS * 5, FS, 0.3, 15));
    expect(analyse([take])).toBeNull();
  });

  it('searches the first eight channels of a wide take, within its buffer cap', () => {
    const take = concat(sine(FS * 2, FS, 997, 0.1), speechLike(FS * 3, FS, 0.3, 19));
    const channels = Array.from({ length: 12 }, (_, c) => (c === 3 ? take : speechLike(take.length, FS, 0.3, 20 + c)));
    const r = analyse(channels)!;
    expect(r.channel).toBe(3);
    expect(Math.abs(r.endSec - 2)).toBeLessThan(0.01);
    const beyond = Array.from({ length: 12 }, (_, c) => (c === 10 ? take : speechLike(take.length, FS, 0.3, 40 + c)));
    expect(analyse(beyond)).toBeNull();
  });

  it('measures the channel carrying the tone', () => {
    const left = speechLike(FS * 5, FS, 0.3, 16);
    const right = concat(sine(FS * 2, FS, 1000, 0.3), speechLike(FS * 3, FS, 0.3, 17));
    const r = analyse([left, right])!;
    expect(r.channel).toBe(1);
  });
});

describe('ToneAnalyzer: wrong declared rate', () => {
  it('reads a 1 kHz tone made at 48 kHz (sox) but declared 44.1 kHz as 918.75 Hz, recorded at 48000', () => {
    // The samples are unchanged, only the clock: f = 1000 × 44100/48000 = 918.75 Hz.
    const fx = generateWithTool('sox', (out) => ['-n', '-r', '48000', '-b', '24', out, 'synth', '3', 'sine', '1000', 'gain', '-18']);
    const r = analyse(fx.channels, 44100)!;
    expect(Math.abs(r.frequencyHz - 918.75)).toBeLessThan(0.1);
    expect(r.likelyRecordedRate).toBe(48000);
  });

  it('reads a 1 kHz tone made at 44.1 kHz (sox) but declared 48 kHz as 1088.4 Hz, recorded at 44100', () => {
    const fx = generateWithTool('sox', (out) => ['-n', '-r', '44100', '-b', '24', out, 'synth', '3', 'sine', '1000', 'gain', '-18']);
    const r = analyse(fx.channels, 48000)!;
    expect(Math.abs(r.frequencyHz - (1000 * 48000) / 44100)).toBeLessThan(0.1);
    expect(r.likelyRecordedRate).toBe(44100);
  });

  it('leaves non-standard tones and correctly clocked standard tones alone', () => {
    expect(likelyRecordedRate(440, 48000)).toBeNull();
    expect(likelyRecordedRate(440 * (48000 / 44100), 48000)).toBeNull();
    expect(likelyRecordedRate(1000, 48000)).toBeNull();
    expect(likelyRecordedRate(997, 44100)).toBeNull();
    expect(likelyRecordedRate((997 * 96000) / 48000, 96000)).toBe(48000);
    const r = analyse([sine(FS * 2, FS, 440, 0.3)])!;
    expect(r.likelyRecordedRate).toBeNull();
  });
});

describe('ToneAnalyzer: configuration', () => {
  it('rejects impossible configuration with a message', () => {
    expect(() => new ToneAnalyzer(pcmFormat(100, 1))).toThrow(/sample rate/);
    expect(() => new ToneAnalyzer(pcmFormat(48000, 65))).toThrow(/channel count/);
    expect(() => new ToneAnalyzer(pcmFormat(48000, 1), { headSec: 1 })).toThrow(/headSec/);
    expect(() => new ToneAnalyzer(pcmFormat(48000, 1), { minToneSec: 20 })).toThrow(/minToneSec/);
    expect(() => new ToneAnalyzer(pcmFormat(48000, 1), { leadInSec: -1 })).toThrow(/leadInSec/);
  });
});
