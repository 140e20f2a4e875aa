/**
 * Small signal generators and helpers for the spectral analyzer tests. Every
 * fixture is computed here or by sox/ffmpeg at test time; nothing is stored.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import wavefile from 'wavefile';
import type { Analyzer, AudioFormat, SampleBlock } from '@/dsp/types';
import { seededRandom, sineFrames } from './testSignals';

const { WaveFile } = wavefile;

// The spectral tests count in frames: their `sine` is the frame-count form of the one generator.
export { seededRandom, sineFrames as sine };

/** Standard normal deviates by Box–Muller. */
export function gaussian(rand: () => number): () => number {
  return () => {
    const u = Math.max(1e-300, rand());
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * rand());
  };
}

/** A format as the reader would describe a PCM file. */
export function pcmFormat(sampleRate: number, channels: number, bits = 24, frames: number | null = null): AudioFormat {
  const blockAlign = channels * Math.ceil(bits / 8);
  return {
    container: 'RIFF',
    encoding: 'pcm',
    sampleRate,
    bitsPerSample: bits,
    validBitsPerSample: bits,
    channels,
    blockAlign,
    dataOffset: 44,
    declaredDataBytes: frames === null ? null : frames * blockAlign,
    channelMask: null,
  };
}

/** White Gaussian noise with the given RMS (full scale 1.0). */
export function whiteNoise(frames: number, rms: number, seed: number): Float64Array {
  const g = gaussian(seededRandom(seed));
  const x = new Float64Array(frames);
  for (let i = 0; i < frames; i++) x[i] = rms * g();
  return x;
}

/**
 * Pink (1/f) noise: white noise through Paul Kellet's economy three-pole filter
 * (±0.5 dB of −3 dB/octave above ~ fs/1000) [from memory], scaled to `rms`.
 */
export function pinkNoise(frames: number, rms: number, seed: number): Float64Array {
  const g = gaussian(seededRandom(seed));
  const x = new Float64Array(frames);
  let b0 = 0, b1 = 0, b2 = 0;
  let sumSq = 0;
  for (let i = 0; i < frames; i++) {
    const w = g();
    b0 = 0.99765 * b0 + w * 0.099046;
    b1 = 0.963 * b1 + w * 0.2965164;
    b2 = 0.57 * b2 + w * 1.0526913;
    x[i] = b0 + b1 + b2 + w * 0.1848;
    sumSq += x[i] * x[i];
  }
  const k = rms / Math.sqrt(sumSq / frames);
  for (let i = 0; i < frames; i++) x[i] *= k;
  return x;
}


export function addInto(target: Float64Array, source: Float64Array, gain = 1): Float64Array {
  for (let i = 0; i < target.length; i++) target[i] += gain * source[i];
  return target;
}

/**
 * Mid-tread quantiser to `bits` (codes −2^(bits−1) … 2^(bits−1)−1), optionally with
 * TPDF dither of 2 LSB peak-to-peak (sum of two uniform ±0.5 LSB variables).
 */
export function quantise(x: Float64Array, bits: number, tpdfSeed: number | null = null): Float64Array {
  const scale = 2 ** (bits - 1);
  const rand = tpdfSeed === null ? null : seededRandom(tpdfSeed);
  const y = new Float64Array(x.length);
  for (let i = 0; i < x.length; i++) {
    const d = rand ? rand() - rand() : 0;
    const code = Math.max(-scale, Math.min(scale - 1, Math.round(x[i] * scale + d)));
    y[i] = code / scale;
  }
  return y;
}

/** Pushes the channels through an analyzer in blocks of `blockFrames` (varied sizes exercise the block logic). */
export function pushInBlocks<R>(analyzer: Analyzer<R>, channels: Float64Array[], blockFrames: number | number[]): R {
  const frames = channels[0].length;
  const sizes = Array.isArray(blockFrames) ? blockFrames : [blockFrames];
  let start = 0;
  let i = 0;
  while (start < frames) {
    const n = Math.min(sizes[i++ % sizes.length], frames - start);
    const block: SampleBlock = { channels: channels.map((c) => c.subarray(start, start + n)), frames: n, startFrame: start };
    analyzer.push(block);
    start += n;
  }
  return analyzer.finish();
}

/** Runs a command-line fixture generator (sox, ffmpeg) in a scratch directory and decodes the WAV it writes. */
export function generateWithTool(
  tool: 'sox' | 'ffmpeg',
  argsFor: (outFile: string) => string[],
): { sampleRate: number; bits: number; channels: Float64Array[] } {
  const dir = mkdtempSync(join(tmpdir(), 'spectral-fixture-'));
  try {
    const out = join(dir, 'fixture.wav');
    execFileSync(`/usr/bin/${tool}`, argsFor(out), { stdio: ['ignore', 'ignore', 'pipe'] });
    return decodeWav(readFileSync(out));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** Decodes integer-PCM WAV bytes to float channels, full scale 1.0 (wavefile does the parsing). */
export function decodeWav(bytes: Uint8Array): { sampleRate: number; bits: number; channels: Float64Array[] } {
  const wav = new WaveFile(bytes);
  const fmt = wav.fmt as { sampleRate: number; bitsPerSample: number; numChannels: number };
  const raw = wav.getSamples(false, Float64Array) as unknown as Float64Array[] | Float64Array;
  const perChannel = fmt.numChannels === 1 ? [raw as Float64Array] : (raw as Float64Array[]);
  const scale = 2 ** (fmt.bitsPerSample - 1);
  return {
    sampleRate: fmt.sampleRate,
    bits: fmt.bitsPerSample,
    channels: perChannel.map((c) => Float64Array.from(c, (v) => v / scale)),
  };
}

/**
 * Speech-like test material: a harmonic voice-like source (20 harmonics falling
 * 6 dB/octave) whose fundamental glides 80–160 Hz, cut into syllables of
 * 150–350 ms with short gaps and a pause of 0.4–0.9 s every few syllables.
 * `peak` scales the loudest syllable. Deterministic for a seed.
 */
export function speechLike(frames: number, sampleRate: number, peak: number, seed: number): Float64Array {
  const rand = seededRandom(seed);
  const envelope = new Float64Array(frames);
  let t = Math.floor(0.2 * sampleRate);
  let syllables = 0;
  while (t < frames) {
    const len = Math.floor((0.15 + 0.2 * rand()) * sampleRate);
    const gain = 0.5 + 0.5 * rand();
    for (let i = 0; i < len && t + i < frames; i++) envelope[t + i] = gain * Math.sin((Math.PI * i) / len) ** 2;
    t += len + Math.floor((0.05 + 0.1 * rand()) * sampleRate);
    if (++syllables % 4 === 0) t += Math.floor((0.4 + 0.5 * rand()) * sampleRate);
  }
  const x = new Float64Array(frames);
  let phase = 0;
  let maxAbs = 0;
  for (let i = 0; i < frames; i++) {
    const s = i / sampleRate;
    const f0 = 120 + 30 * Math.sin(2 * Math.PI * 0.7 * s) + 10 * Math.sin(2 * Math.PI * 3.1 * s);
    phase += (2 * Math.PI * f0) / sampleRate;
    if (envelope[i] === 0) continue;
    let v = 0;
    for (let h = 1; h <= 20 && h * f0 < 0.45 * sampleRate; h++) v += Math.sin(h * phase) / h;
    x[i] = envelope[i] * v;
    maxAbs = Math.max(maxAbs, Math.abs(x[i]));
  }
  const k = maxAbs > 0 ? peak / maxAbs : 0;
  for (let i = 0; i < frames; i++) x[i] *= k;
  return x;
}

/** Mains hum: `base` Hz and its harmonics 2…6 with falling amplitudes; `rmsDbfs` sets the total RMS (square-wave reference). */
export function mainsHum(frames: number, sampleRate: number, base: 50 | 60, rmsDbfs: number): Float64Array {
  const amps = [1, 0.7, 0.5, 0.35, 0.25, 0.18];
  const x = new Float64Array(frames);
  for (let h = 1; h <= amps.length; h++) addInto(x, sineFrames(frames, sampleRate, h * base, amps[h - 1], 0.3 * h));
  let ms = 0;
  for (const a of amps) ms += (a * a) / 2;
  const k = 10 ** (rmsDbfs / 20) / Math.sqrt(ms);
  for (let i = 0; i < frames; i++) x[i] *= k;
  return x;
}

/** RMS in dBFS (square-wave reference: 20·log10 of the plain RMS, full scale 1.0). */
export function rmsDbfs(x: Float64Array): number {
  let s = 0;
  for (let i = 0; i < x.length; i++) s += x[i] * x[i];
  return 10 * Math.log10(s / x.length);
}

/**
 * Music-like test material: chords of harmonic notes (harmonics falling 1/h up to
 * 0.45·fs, each note with a decaying envelope) over a soft pink-noise bed
 * (cymbal/room-like, 20 dB below), normalised to `peak`.
 */
export function musicLike(frames: number, sampleRate: number, peak: number, seed: number): Float64Array {
  const rand = seededRandom(seed);
  const x = pinkNoise(frames, 0.1, seed + 1);
  const noteFrames = Math.floor(0.5 * sampleRate);
  for (let start = 0; start < frames; start += noteFrames) {
    for (let voice = 0; voice < 3; voice++) {
      const f0 = 110 * 2 ** (Math.floor(rand() * 36) / 12);
      const amp = 0.3 + 0.4 * rand();
      for (let h = 1; h * f0 < 0.45 * sampleRate; h++) {
        const w = (2 * Math.PI * h * f0) / sampleRate;
        const a = amp / h;
        const phase = 2 * Math.PI * rand();
        for (let i = 0; i < noteFrames && start + i < frames; i++) x[start + i] += a * Math.exp(-i / (0.25 * sampleRate)) * Math.sin(w * i + phase);
      }
    }
  }
  let maxAbs = 0;
  for (let i = 0; i < frames; i++) maxAbs = Math.max(maxAbs, Math.abs(x[i]));
  for (let i = 0; i < frames; i++) x[i] *= peak / maxAbs;
  return x;
}

/** Sends float channels through a command-line tool (sox) as a 24-bit WAV and decodes what it writes. */
export function processWithTool(
  channels: Float64Array[],
  sampleRate: number,
  argsFor: (inFile: string, outFile: string) => string[],
): { sampleRate: number; bits: number; channels: Float64Array[] } {
  const dir = mkdtempSync(join(tmpdir(), 'spectral-fixture-'));
  try {
    const input = join(dir, 'in.wav');
    const wav = new WaveFile();
    const scale = 2 ** 23;
    const codes = channels.map((c) => Array.from(c, (v) => Math.max(-scale, Math.min(scale - 1, Math.round(v * scale)))));
    wav.fromScratch(channels.length, sampleRate, '24', codes);
    writeFileSync(input, wav.toBuffer());
    const out = join(dir, 'out.wav');
    execFileSync('/usr/bin/sox', argsFor(input, out), { stdio: ['ignore', 'ignore', 'pipe'] });
    return decodeWav(readFileSync(out));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
