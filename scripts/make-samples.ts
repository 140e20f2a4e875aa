/**
 * Writes Takeproof's demo takes: short invented studio recordings, each with
 * one typical technical problem (or none). Deterministic (seeded PRNG); a file
 * that already exists is left alone.
 *
 *   npx tsx scripts/make-samples.ts [outDir]     (default: samples/)
 *
 * The programme material is synthetic "speech": a band-limited sawtooth voice
 * source with gliding pitch through three formant resonators, syllable
 * envelopes, phrase pauses, fricative noise bursts and a little room tone, then
 * an anti-alias low-pass as a converter would apply. Levels are set with the
 * project's own BS.1770 loudness meter.
 */
import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import wavefile from 'wavefile';
import { LoudnessAnalyzer } from '../dsp/analyzers/loudness';
import type { AudioFormat } from '../dsp/types';
import { seededRandom } from '../tests/support/testSignals';

const { WaveFile } = wavefile;

export interface DemoTake {
  file: string;
  /** What the take is, in the invented scenario. */
  scenario: string;
  /** What Takeproof should find. */
  expect: string;
}

export const DEMO_TAKES: DemoTake[] = [
  {
    file: 'take-01-clean-interview.wav',
    scenario: 'Studio B, guest interview, 48 kHz / 24-bit stereo, well set gain.',
    expect: 'No problems: about −23 LUFS, peaks below −1 dBTP, noise floor near −78 dBFS, bandwidth about 21 kHz, no hum, no tone.',
  },
  {
    file: 'take-02-hot-preamp.wav',
    scenario: 'A two-microphone interview recorded too hot: the host preamp (left) flattens peaks at −3 dBFS from 3 to 6 s; the guest channel (right) clips at full scale from 8 to 10 s.',
    expect: 'Clipping below full scale on the left channel and at full scale on the right; true peak above the limit.',
  },
  {
    file: 'take-03-16bit-padded.wav',
    scenario: 'A 16-bit recorder file (TPDF-dithered) converted to 24-bit by padding the low 8 bits with zeros.',
    expect: 'Effective resolution 16 bits in a 24-bit container.',
  },
  {
    file: 'take-04-remote-guest-narrowband.wav',
    scenario: 'A remote guest heard over a wideband speech link: content ends at about 7.8 kHz, then stored at 48 kHz.',
    expect: 'Effective bandwidth about 7.8 kHz; implied source rate 16 kHz.',
  },
  {
    file: 'take-05-mains-hum.wav',
    scenario: 'A location interview with a ground loop: 50 Hz hum and harmonics at about −50 dBFS under the voice.',
    expect: 'Mains hum at 50 Hz; noise floor about −50 dBFS.',
  },
  {
    file: 'take-06-lineup-tone.wav',
    scenario: 'A programme preceded by 3 s of 1 kHz line-up tone at −18 dBFS.',
    expect: 'Tone from 0 to 3 s, 1000 Hz, −18 dBFS peak, no sample-rate problem.',
  },
  {
    file: 'take-07-mislabelled-rate.wav',
    scenario: 'A 44.1 kHz recording (1 kHz line-up tone, then programme) whose header says 48 kHz.',
    expect: 'Tone reads about 1088.4 Hz; the take was likely recorded at 44.1 kHz.',
  },
];

const FS = 48000;

/** RBJ audio-EQ-cookbook biquad (band-pass with 0 dB peak, or high-pass), direct form I, in place. */
class Biquad {
  private b0 = 0; private b1 = 0; private b2 = 0; private a1 = 0; private a2 = 0;
  private x1 = 0; private x2 = 0; private y1 = 0; private y2 = 0;
  set(kind: 'bandpass' | 'highpass', hz: number, q: number, fs: number): void {
    const w = (2 * Math.PI * hz) / fs;
    const alpha = Math.sin(w) / (2 * q);
    const cos = Math.cos(w);
    const a0 = 1 + alpha;
    if (kind === 'bandpass') {
      this.b0 = alpha / a0; this.b1 = 0; this.b2 = -alpha / a0;
    } else {
      this.b0 = (1 + cos) / 2 / a0; this.b1 = -(1 + cos) / a0; this.b2 = (1 + cos) / 2 / a0;
    }
    this.a1 = (-2 * cos) / a0;
    this.a2 = (1 - alpha) / a0;
  }
  step(x: number): number {
    const y = this.b0 * x + this.b1 * this.x1 + this.b2 * this.x2 - this.a1 * this.y1 - this.a2 * this.y2;
    this.x2 = this.x1; this.x1 = x; this.y2 = this.y1; this.y1 = y;
    return y;
  }
}

/** Windowed-sinc low-pass FIR (Blackman window), unity gain at DC; `taps` odd. */
function lowPassFir(cutoffHz: number, fs: number, taps: number): Float64Array {
  const h = new Float64Array(taps);
  const mid = (taps - 1) / 2;
  const fc = cutoffHz / fs;
  let sum = 0;
  for (let n = 0; n < taps; n++) {
    const k = n - mid;
    const sinc = k === 0 ? 2 * fc : Math.sin(2 * Math.PI * fc * k) / (Math.PI * k);
    const w = 0.42 - 0.5 * Math.cos((2 * Math.PI * n) / (taps - 1)) + 0.08 * Math.cos((4 * Math.PI * n) / (taps - 1));
    h[n] = sinc * w;
    sum += h[n];
  }
  for (let n = 0; n < taps; n++) h[n] /= sum;
  return h;
}

/** Linear-phase FIR filtering with the group delay removed (output aligned with input). */
function filterFir(x: Float64Array, h: Float64Array): Float64Array {
  const y = new Float64Array(x.length);
  const mid = (h.length - 1) / 2;
  for (let i = 0; i < x.length; i++) {
    let s = 0;
    const k0 = Math.max(0, i + mid - (x.length - 1));
    const k1 = Math.min(h.length - 1, i + mid);
    for (let k = k0; k <= k1; k++) s += h[k] * x[i + mid - k];
    y[i] = s;
  }
  return y;
}

/** Pink-ish room tone (Kellet's economy 1/f filter on white noise), scaled to `rmsDbfs`. */
function roomTone(frames: number, rmsDbfs: number, rand: () => number): Float64Array {
  const x = new Float64Array(frames);
  let b0 = 0, b1 = 0, b2 = 0, ss = 0;
  for (let i = 0; i < frames; i++) {
    const w = rand() + rand() + rand() - 1.5;
    b0 = 0.99765 * b0 + w * 0.099046;
    b1 = 0.963 * b1 + w * 0.2965164;
    b2 = 0.57 * b2 + w * 1.0526913;
    x[i] = b0 + b1 + b2 + w * 0.1848;
    ss += x[i] * x[i];
  }
  const k = 10 ** (rmsDbfs / 20) / Math.sqrt(ss / frames);
  for (let i = 0; i < frames; i++) x[i] *= k;
  return x;
}

/** PolyBLEP correction for a sawtooth discontinuity (phase t in [0, 1), increment dt). */
function polyBlep(t: number, dt: number): number {
  if (t < dt) { const u = t / dt; return u + u - u * u - 1; }
  if (t > 1 - dt) { const u = (t - 1) / dt; return u * u + u + u + 1; }
  return 0;
}

const VOWELS: [number, number, number][] = [
  [730, 1090, 2440], [530, 1840, 2480], [270, 2290, 3010], [570, 840, 2410], [300, 870, 2240], [660, 1720, 2410],
];

/** Speech-like programme, mono, peak-normalised to 1 before level setting. */
function speech(frames: number, fs: number, seed: number): Float64Array {
  const rand = seededRandom(seed);
  const out = new Float64Array(frames);
  const formants = [new Biquad(), new Biquad(), new Biquad()];
  const hiss = new Biquad();
  hiss.set('highpass', 4500, 0.7, fs);
  let t = Math.floor(0.3 * fs);
  let phase = 0;
  let lp = 0;
  let syllable = 0;
  const base = 105 + 30 * rand();
  while (t < frames) {
    const len = Math.floor((0.12 + 0.18 * rand()) * fs);
    const vowel = VOWELS[Math.floor(rand() * VOWELS.length)];
    const gains = [1, 0.5, 0.22];
    formants.forEach((f, i) => f.set('bandpass', vowel[i] * (0.95 + 0.1 * rand()), 6 + 4 * rand(), fs));
    const fricative = rand() < 0.35;
    const fricLen = Math.floor((0.06 + 0.08 * rand()) * fs);
    const gain = 0.6 + 0.4 * rand();
    const pitchStart = base * (1 + 0.25 * rand());
    const pitchEnd = base * (0.85 + 0.2 * rand());
    for (let i = 0; i < len && t + i < frames; i++) {
      const u = i / len;
      const f0 = pitchStart + (pitchEnd - pitchStart) * u;
      const dt = f0 / fs;
      phase += dt;
      if (phase >= 1) phase -= 1;
      const saw = 2 * phase - 1 - polyBlep(phase, dt);
      lp += 0.25 * (saw - lp); // one-pole glottal tilt
      let v = 0;
      for (let k = 0; k < 3; k++) v += gains[k] * formants[k].step(lp);
      const env = Math.sin(Math.PI * u) ** 1.5;
      let s = gain * env * v;
      if (fricative && i < fricLen) {
        const fe = Math.sin((Math.PI * i) / fricLen);
        s += 0.35 * gain * fe * hiss.step(2 * rand() - 1);
      }
      out[t + i] += s;
    }
    t += len + Math.floor((0.03 + 0.08 * rand()) * fs);
    if (++syllable % (3 + Math.floor(rand() * 4)) === 0) t += Math.floor((0.45 + 0.5 * rand()) * fs);
  }
  let peak = 0;
  for (let i = 0; i < frames; i++) peak = Math.max(peak, Math.abs(out[i]));
  for (let i = 0; i < frames; i++) out[i] /= peak;
  return out;
}

/** Stereo programme: the voice with a slight level and time offset between channels, plus independent room tone. */
function programme(frames: number, fs: number, seed: number, roomDbfs: number): [Float64Array, Float64Array] {
  const voice = speech(frames, fs, seed);
  const rand = seededRandom(seed + 1);
  const delay = Math.round(0.0003 * fs);
  const left = new Float64Array(frames);
  const right = new Float64Array(frames);
  const roomL = roomTone(frames, roomDbfs, rand);
  const roomR = roomTone(frames, roomDbfs, rand);
  for (let i = 0; i < frames; i++) {
    left[i] = voice[i] + roomL[i];
    right[i] = 0.9 * (i >= delay ? voice[i - delay] : 0) + roomR[i];
  }
  return [left, right];
}

function integratedLufs(channels: Float64Array[], fs: number): number {
  const format: AudioFormat = {
    container: 'RIFF', encoding: 'pcm', sampleRate: fs, bitsPerSample: 24, validBitsPerSample: 24,
    channels: channels.length, blockAlign: 3 * channels.length, dataOffset: 44, declaredDataBytes: null, channelMask: null,
  };
  const meter = new LoudnessAnalyzer(format);
  meter.push({ channels, frames: channels[0].length, startFrame: 0 });
  const lufs = meter.finish().integratedLufs;
  if (lufs === null) throw new Error('programme too quiet to measure');
  return lufs;
}

/** Scales the voice so the whole take reads `targetLufs`; the room tone is added afterwards at its own level. */
function atLoudness(channels: Float64Array[], fs: number, targetLufs: number): Float64Array[] {
  const k = 10 ** ((targetLufs - integratedLufs(channels, fs)) / 20);
  return channels.map((c) => c.map((v) => v * k));
}

/** Quantises to signed integers of `bits` with TPDF dither of 2 LSB peak-to-peak, clamped to the code range. */
function toCodes(x: Float64Array, bits: number, rand: () => number): Int32Array {
  const scale = 2 ** (bits - 1);
  const out = new Int32Array(x.length);
  for (let i = 0; i < x.length; i++) {
    out[i] = Math.max(-scale, Math.min(scale - 1, Math.round(x[i] * scale + rand() - rand())));
  }
  return out;
}

function writeWav(path: string, fs: number, bits: 16 | 24, codes: Int32Array[]): void {
  const wav = new WaveFile();
  wav.fromScratch(codes.length, fs, String(bits), codes.map((c) => Array.from(c)));
  writeFileSync(path, wav.toBuffer());
}

function sineAt(frames: number, fs: number, hz: number, peak: number): Float64Array {
  const x = new Float64Array(frames);
  // 10 ms raised-cosine fades, as tone generators apply, so the tone starts and stops without a click.
  const fade = Math.round(0.01 * fs);
  for (let i = 0; i < frames; i++) {
    const edge = Math.min(1, i / fade, (frames - 1 - i) / fade);
    const g = edge >= 1 ? 1 : 0.5 - 0.5 * Math.cos(Math.PI * Math.max(0, edge));
    x[i] = peak * g * Math.sin((2 * Math.PI * hz * i) / fs);
  }
  return x;
}

/** The converter's anti-alias filter: passband to ≈ 0.43·fs, stopband from ≈ 0.48·fs. */
function converterFilter(channels: Float64Array[], fs: number): Float64Array[] {
  const h = lowPassFir(0.445 * fs, fs, 255);
  return channels.map((c) => filterFir(c, h));
}

function build(take: string): { fs: number; bits: 16 | 24; codes: Int32Array[] } {
  const seconds = 12;
  const frames = seconds * FS;
  const rand = seededRandom(1000 + take.length * 7 + take.charCodeAt(6));
  const room = (n: number, fs: number, db: number) => [roomTone(n, db, rand), roomTone(n, db, rand)];
  const mix = (a: Float64Array[], b: Float64Array[]) => a.map((c, i) => c.map((v, j) => v + b[i][j]));
  switch (take) {
    case 'take-01-clean-interview.wav': {
      const voice = atLoudness(programme(frames, FS, 11, -200), FS, -23);
      const out = converterFilter(mix(voice, room(frames, FS, -78)), FS);
      return { fs: FS, bits: 24, codes: out.map((c) => toCodes(c, 24, rand)) };
    }
    case 'take-02-hot-preamp.wav': {
      const voice = atLoudness(programme(frames, FS, 12, -200), FS, -20);
      const out = converterFilter(mix(voice, room(frames, FS, -76)), FS);
      const fullScale = (2 ** 23 - 1) / 2 ** 23;
      const flat = 10 ** (-3 / 20);
      // Left (host microphone), 3–6 s: an overdriven preamp flattens the peaks at −3 dBFS.
      for (let i = 3 * FS; i < 6 * FS; i++) out[0][i] = Math.max(-flat, Math.min(flat, 3 * out[0][i]));
      // Right (guest microphone), 8–10 s: the gain is pushed and the converter runs out of codes.
      for (let i = 8 * FS; i < 10 * FS; i++) out[1][i] = Math.max(-1, Math.min(fullScale, 5 * out[1][i]));
      // Dither everything except the clipped samples: a flat top is one repeated code.
      const flatCode = Math.round(10 ** (-3 / 20) * 2 ** 23);
      const codes = out.map((c) => {
        const q = toCodes(c, 24, rand);
        for (let i = 3 * FS; i < 6 * FS; i++) if (Math.abs(c[i]) === 10 ** (-3 / 20)) q[i] = Math.sign(c[i]) * flatCode;
        for (let i = 8 * FS; i < 10 * FS; i++) {
          if (c[i] === fullScale) q[i] = 2 ** 23 - 1;
          else if (c[i] === -1) q[i] = -(2 ** 23);
        }
        return q;
      });
      return { fs: FS, bits: 24, codes };
    }
    case 'take-03-16bit-padded.wav': {
      const voice = atLoudness(programme(frames, FS, 13, -200), FS, -23);
      const out = converterFilter(mix(voice, room(frames, FS, -82)), FS);
      // 16-bit codes (TPDF-dithered) shifted into the top of a 24-bit word: the low 8 bits are zero.
      return { fs: FS, bits: 24, codes: out.map((c) => toCodes(c, 16, rand).map((v) => v * 256)) };
    }
    case 'take-04-remote-guest-narrowband.wav': {
      // Set a little hot before the link filter, which takes away the weighted upper band.
      const voice = atLoudness(programme(frames, FS, 14, -200), FS, -20.5);
      const line = mix(voice, room(frames, FS, -70));
      // The link's low-pass: content ends at ≈ 7.8 kHz (511-tap windowed sinc, −6 dB at 7.8 kHz).
      const h = lowPassFir(7800, FS, 511);
      const out = line.map((c) => filterFir(c, h));
      return { fs: FS, bits: 24, codes: out.map((c) => toCodes(c, 24, rand)) };
    }
    case 'take-05-mains-hum.wav': {
      const voice = atLoudness(programme(frames, FS, 15, -200), FS, -23);
      const hum = [0, 1].map(() => new Float64Array(frames));
      const amps = [1, 0.6, 0.45, 0.3, 0.2, 0.12, 0.08];
      let ms = 0;
      for (const a of amps) ms += (a * a) / 2;
      const k = 10 ** (-50 / 20) / Math.sqrt(ms);
      for (let i = 0; i < frames; i++) {
        let v = 0;
        for (let h = 0; h < amps.length; h++) v += amps[h] * Math.sin(2 * Math.PI * 50 * (h + 1) * (i / FS) + 0.7 * h);
        hum[0][i] = k * v;
        hum[1][i] = 0.95 * k * v;
      }
      const out = converterFilter(mix(mix(voice, room(frames, FS, -76)), hum), FS);
      return { fs: FS, bits: 24, codes: out.map((c) => toCodes(c, 24, rand)) };
    }
    case 'take-06-lineup-tone.wav':
    case 'take-07-mislabelled-rate.wav': {
      // Take 07 is made at 44.1 kHz; its header will claim 48 kHz.
      const fs = take === 'take-06-lineup-tone.wav' ? FS : 44100;
      const n = seconds * fs;
      const toneFrames = 3 * fs;
      const voice = atLoudness(programme(n - toneFrames, fs, 16, -200), fs, -23);
      const tone = sineAt(toneFrames, fs, 1000, 10 ** (-18 / 20));
      const h = lowPassFir(0.445 * fs, fs, 255);
      const out = voice.map((c) => {
        // Programme (voice + room tone) through the converter filter; the generator's tone is clean.
        const prog = filterFir(c, h);
        const room = filterFir(roomTone(c.length, -80, rand), h);
        const x = new Float64Array(n);
        x.set(tone, 0);
        for (let j = 0; j < c.length; j++) x[toneFrames + j] = prog[j] + room[j];
        return x;
      });
      // Take 07's header declares 48 kHz although the samples were made at 44.1 kHz.
      return { fs: FS, bits: 24, codes: out.map((c) => toCodes(c, 24, rand)) };
    }
    default:
      throw new Error(`unknown demo take ${take}`);
  }
}

/** Writes every demo take missing from `outDir`; returns the paths written. */
export function makeSamples(outDir: string, only?: string[]): string[] {
  mkdirSync(outDir, { recursive: true });
  const written: string[] = [];
  for (const take of DEMO_TAKES) {
    if (only && !only.includes(take.file)) continue;
    const path = join(outDir, take.file);
    if (existsSync(path)) continue;
    const { fs, bits, codes } = build(take.file);
    writeWav(path, fs, bits, codes);
    written.push(path);
  }
  return written;
}

if (process.argv[1] && import.meta.url === pathToFileURL(resolve(process.argv[1])).href) {
  const outDir = process.argv[2] ?? 'samples';
  const written = makeSamples(outDir);
  for (const path of written) console.log(`wrote ${path}`);
  if (written.length === 0) console.log(`all demo takes already present in ${outDir}`);
}
