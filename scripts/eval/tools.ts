import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/**
 * The general-purpose tools the evaluation corpus is made with: espeak-ng for speech and sox for
 * levelling, resampling, room and music-like synthesis. Samples come back as float64 (full scale 1.0).
 */

function run(command: string, args: string[]): void {
  const result = spawnSync(command, args, { encoding: 'utf8' });
  if (result.error) throw new Error(`${command} could not run (${result.error.message}); install it (Debian: apt-get install espeak-ng sox)`);
  if (result.status !== 0) throw new Error(`${command} ${args.join(' ')} exited with ${result.status}: ${result.stderr.slice(-400)}`);
}

/** Runs sox with raw float64 output and returns the samples, de-interleaved. `-D`: no dither, so results are repeatable. */
export function soxToSamples(inputArgs: string[], sampleRate: number, channels: number, effects: string[]): Float64Array[] {
  const folder = mkdtempSync(join(tmpdir(), 'takeproof-eval-'));
  try {
    const out = join(folder, 'out.f64');
    run('sox', ['-D', ...inputArgs, '-t', 'f64', '-r', String(sampleRate), '-c', String(channels), out, ...effects]);
    const bytes = readFileSync(out);
    const interleaved = new Float64Array(bytes.buffer, bytes.byteOffset, Math.floor(bytes.length / 8));
    const frames = Math.floor(interleaved.length / channels);
    return Array.from({ length: channels }, (_, channel) => {
      const samples = new Float64Array(frames);
      for (let i = 0; i < frames; i++) samples[i] = interleaved[i * channels + channel];
      return samples;
    });
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}

export interface Voice {
  /** espeak-ng voice with variant, e.g. "en-gb+m3". */
  name: string;
  /** Words per minute. */
  rate: number;
  /** espeak-ng pitch, 0-99. */
  pitch: number;
}

/**
 * Speech from espeak-ng (22.05 kHz 16-bit, unclipped), put through sox: the low cut most voice chains
 * have (at `lowCutHz`; none when 0, as a flat microphone with no filter), a small room (reverb; none
 * when `roomPercent` is 0), resampling to `sampleRate`, and levelled so its sample peak sits at `peakDbfs`.
 */
export function speak(text: string, voice: Voice, sampleRate: number, peakDbfs: number, roomPercent = 25, lowCutHz = 70): Float64Array {
  const folder = mkdtempSync(join(tmpdir(), 'takeproof-speech-'));
  try {
    const wav = join(folder, 'speech.wav');
    run('espeak-ng', ['-v', voice.name, '-s', String(voice.rate), '-p', String(voice.pitch), '-w', wav, text]);
    const room = roomPercent > 0 ? ['reverb', String(roomPercent), '50', '30'] : [];
    const lowCut = lowCutHz > 0 ? ['highpass', String(lowCutHz)] : [];
    return soxToSamples([wav], sampleRate, 1, [...lowCut, ...room, 'rate', '-v', String(sampleRate), 'gain', '-n', String(peakDbfs)])[0];
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}

/** Music-like material from sox's synthesiser: `synthArgs` after `synth <seconds>`, then effects. */
export function synthesise(seconds: number, synthArgs: string[], sampleRate: number, channels: number, effects: string[]): Float64Array[] {
  return soxToSamples(['-n'], sampleRate, channels, ['synth', String(seconds), ...synthArgs, ...effects]);
}

/** Runs signals (one per channel) through sox effects, output at `toRate` with `toChannels` channels (default: as many as given). */
export function soxProcess(channels: Float64Array[], fromRate: number, toRate: number, effects: string[], toChannels = channels.length): Float64Array[] {
  const folder = mkdtempSync(join(tmpdir(), 'takeproof-process-'));
  try {
    const input = join(folder, 'in.f64');
    const frames = Math.min(...channels.map((channel) => channel.length));
    const interleaved = new Float64Array(frames * channels.length);
    channels.forEach((channel, c) => {
      for (let i = 0; i < frames; i++) interleaved[i * channels.length + c] = channel[i];
    });
    writeFileSync(input, Buffer.from(interleaved.buffer));
    return soxToSamples(['-t', 'f64', '-r', String(fromRate), '-c', String(channels.length), input], toRate, toChannels, effects);
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}

/** Resamples a mono signal with sox's very-high-quality rate converter (its low-pass stops just below the old Nyquist). */
export function resample(signal: Float64Array, fromRate: number, toRate: number): Float64Array {
  return soxProcess([signal], fromRate, toRate, ['rate', '-v', String(toRate)])[0];
}

/**
 * What a converter's anti-alias filter leaves of full-band noise: sox's windowed-sinc low-pass at
 * 0.45 of the sample rate (converter pass bands end at about 0.45 fs).
 */
export function converterBand(signal: Float64Array, sampleRate: number): Float64Array {
  const filtered = soxProcess([signal], sampleRate, sampleRate, ['sinc', `-${Math.round(0.45 * sampleRate)}`])[0];
  return filtered.length === signal.length ? filtered : filtered.subarray(0, signal.length);
}
