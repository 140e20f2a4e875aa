import { seededRandom } from '../../tests/support/testSignals';
import { converterBand, speak, synthesise, type Voice } from './tools';

/**
 * Realistic clean material: what a microphone in a room delivers, built from espeak-ng speech and
 * sox synthesis. A real take is never digitally silent (room tone and the preamp's noise are
 * always there) and a real 44.1-96 kHz microphone take reaches past 15 kHz (breath, sibilants), so
 * both are added: espeak-ng's 22.05 kHz speech has nothing above 11 kHz of its own.
 */

/** Voices of different pitch, rate and accent [espeak-ng variants]. */
export const VOICES: Voice[] = [
  { name: 'en-gb+m3', rate: 150, pitch: 30 },
  { name: 'en-us+f3', rate: 170, pitch: 60 },
  { name: 'en-gb-scotland+m1', rate: 140, pitch: 20 },
  { name: 'en-gb-x-rp+f2', rate: 185, pitch: 70 },
  { name: 'en-029+m2', rate: 160, pitch: 45 },
  { name: 'en-us+m7', rate: 130, pitch: 10 },
  { name: 'en-gb+f4', rate: 175, pitch: 80 },
];

/** Invented lines for the invented studio's takes. */
export const LINES = [
  'Welcome back to the programme. Today we walk the old canal path from the lock keeper\'s cottage to the harbour, and we talk to the people who still work the boats.',
  'Scene four, take two. The kitchen is dark except for the lamp by the window. She opens the letter slowly, reads the first line twice, and puts it face down on the table.',
  'The weather turned just after lunch. By three o\'clock the rain was coming sideways off the hill, and the whole crew was sheltering under the loading bay roof.',
  'If you have ever wondered why bread rises, the answer is a tiny living thing. Yeast eats the sugar in the flour and breathes out bubbles of gas.',
  'Thank you for joining us. Before the next story, a quick word about the listener letters we received this week, which were kind, funny and occasionally very firm.',
  'Number seven, the blue door. Knock twice, wait, then knock again. If nobody answers, leave the parcel with the neighbour at number nine.',
];

/** Adds `b` (scaled) into `a` from `offset` frames on, in place. */
export function mixInto(a: Float64Array, b: Float64Array, gain = 1, offset = 0): Float64Array {
  for (let i = 0; i < b.length && i + offset < a.length; i++) if (i + offset >= 0) a[i + offset] += gain * b[i];
  return a;
}

const dbToGain = (db: number) => 10 ** (db / 20);

/** Room tone: pink-ish noise (white through two one-pole low-passes) with a little low rumble, at `levelDbfs` RMS. */
export function roomTone(frames: number, sampleRate: number, levelDbfs: number, seed: number): Float64Array {
  const random = seededRandom(seed);
  const out = new Float64Array(frames);
  const pole1 = Math.exp((-2 * Math.PI * 400) / sampleRate);
  const pole2 = Math.exp((-2 * Math.PI * 60) / sampleRate);
  let low1 = 0, low2 = 0, power = 0;
  for (let i = 0; i < frames; i++) {
    const white = random() + random() + random() - 1.5;
    low1 = pole1 * low1 + (1 - pole1) * white;
    low2 = pole2 * low2 + (1 - pole2) * white;
    out[i] = 0.35 * white + 2 * low1 + 3 * low2;
    power += out[i] * out[i];
  }
  const gain = dbToGain(levelDbfs) / Math.sqrt(power / Math.max(1, frames) || 1);
  for (let i = 0; i < frames; i++) out[i] *= gain;
  return converterBand(out, sampleRate);
}

/**
 * The top octave a microphone hears and espeak-ng does not make: noise above about 9 kHz shaped by
 * the speech's own envelope (breath and sibilance follow the voice), `relativeDb` below it.
 */
export function airBand(speech: Float64Array, sampleRate: number, relativeDb: number, seed: number): Float64Array {
  const random = seededRandom(seed);
  const out = new Float64Array(speech.length);
  const attack = 1 - Math.exp(-1 / (0.002 * sampleRate));
  const release = 1 - Math.exp(-1 / (0.03 * sampleRate));
  const highPass = Math.exp((-2 * Math.PI * 9000) / sampleRate);
  // Twice the gain: the high-passed noise carries about half of its power above 9 kHz.
  const gain = 2 * dbToGain(relativeDb);
  let envelope = 0, previousWhite = 0, high = 0;
  for (let i = 0; i < speech.length; i++) {
    const magnitude = Math.abs(speech[i]);
    envelope += (magnitude - envelope) * (magnitude > envelope ? attack : release);
    const white = random() - random();
    high = highPass * (high + white - previousWhite);
    previousWhite = white;
    out[i] = gain * high * envelope;
  }
  return converterBand(out, sampleRate);
}

export interface SpeechOptions {
  voice: Voice;
  line: string;
  sampleRate: number;
  peakDbfs: number;
  roomToneDbfs: number;
  seed: number;
  /** Reverberation of the room, percent (0: a dead booth). Default 25. */
  roomPercent?: number;
  /** The voice chain's low cut, Hz (0: none, a flat microphone). Default 70. */
  lowCutHz?: number;
}

/** One voice on one microphone in a room: speech, its air band, room tone. */
export function speechTake(options: SpeechOptions): Float64Array {
  const { voice, line, sampleRate, peakDbfs, roomToneDbfs, seed } = options;
  const speech = speak(line, voice, sampleRate, peakDbfs, options.roomPercent ?? 25, options.lowCutHz ?? 70);
  const take = new Float64Array(speech.length + Math.round(0.6 * sampleRate));
  const start = Math.round(0.3 * sampleRate);
  mixInto(take, speech, 1, start);
  mixInto(take, airBand(speech, sampleRate, -18, seed), 1, start);
  return mixInto(take, roomTone(take.length, sampleRate, roomToneDbfs, seed + 1000));
}

export interface ConversationOptions {
  voices: [Voice, Voice];
  lines: [string, string];
  sampleRate: number;
  peakDbfs: number;
  /** How much of each voice reaches the other's microphone, dB (negative). */
  bleedDb: number;
  /** Extra path to the far microphone, seconds (a metre is about 2.9 ms). */
  bleedDelaySec: number;
  seed: number;
}

/**
 * Two people, two microphones: each voice on its own microphone and, later and quieter, on the
 * other's; turns alternate with a short overlap; each microphone has its own room tone.
 */
export function conversationTake(options: ConversationOptions): [Float64Array, Float64Array] {
  const { voices, lines, sampleRate, peakDbfs, bleedDb, bleedDelaySec, seed } = options;
  const sentences = lines.map((line) => line.split(/(?<=[.?!])\s+/));
  const turns: { voice: 0 | 1; speech: Float64Array }[] = [];
  for (let i = 0; i < Math.max(sentences[0].length, sentences[1].length); i++) {
    for (const voice of [0, 1] as const) if (sentences[voice][i]) turns.push({ voice, speech: speak(sentences[voice][i], voices[voice], sampleRate, peakDbfs) });
  }
  const delay = Math.round(bleedDelaySec * sampleRate);
  const overlap = Math.round(0.25 * sampleRate);
  const frames = turns.reduce((sum, turn) => sum + turn.speech.length - overlap, 0) + Math.round(1.2 * sampleRate) + delay;
  const mics = [new Float64Array(frames), new Float64Array(frames)];
  let at = Math.round(0.4 * sampleRate);
  for (const turn of turns) {
    const own = turn.voice;
    mixInto(mics[own], turn.speech, 1, at);
    mixInto(mics[own], airBand(turn.speech, sampleRate, -18, seed + at), 1, at);
    mixInto(mics[1 - own], turn.speech, dbToGain(bleedDb), at + delay);
    at += turn.speech.length - overlap;
  }
  mixInto(mics[0], roomTone(frames, sampleRate, -68, seed + 1));
  mixInto(mics[1], roomTone(frames, sampleRate, -67, seed + 2));
  return [mics[0], mics[1]];
}

/**
 * Music-like material: plucked chords and a sustained pad from sox's synthesiser in a room, each
 * instrument panned to its own place, so the two channels are related but not identical.
 */
export function musicTake(seconds: number, sampleRate: number, peakDbfs: number, seed: number, channels = 2): Float64Array[] {
  const random = seededRandom(seed);
  const chords = [[220, 277.2, 329.6], [196, 246.9, 293.7], [174.6, 220, 261.6], [164.8, 207.7, 246.9]];
  const pluckParts: Float64Array[] = [];
  for (let t = 0; t < seconds; t += 0.5) {
    const chord = chords[Math.floor(random() * chords.length)];
    const octave = random() < 0.3 ? 2 : 1;
    pluckParts.push(synthesise(0.5, chord.flatMap((f) => ['pluck', String(f * octave)]), sampleRate, 1, ['gain', '-n', String(-3 - 6 * random())])[0]);
  }
  const plucks = new Float64Array(Math.round(seconds * sampleRate));
  let offset = 0;
  for (const part of pluckParts) {
    mixInto(plucks, part, 1, offset);
    offset += part.length;
  }
  const pad = synthesise(seconds, ['sine', '110', 'triangle', '165', 'sine', '220'], sampleRate, 1, ['tremolo', '0.3', '40', 'gain', '-n', '-12'])[0];
  const room = (signal: Float64Array, seedOffset: number) => mixInto(signal.slice(), roomTone(signal.length, sampleRate, -72, seed + seedOffset));
  const pans = Array.from({ length: channels }, (_, c) => (channels === 1 ? 0.5 : c / (channels - 1)));
  const out = pans.map((pan, c) => {
    const channel = new Float64Array(plucks.length);
    mixInto(channel, plucks, Math.cos((pan * Math.PI) / 2) + 0.3);
    mixInto(channel, pad, Math.sin((pan * Math.PI) / 2) + 0.3);
    return room(channel, c + 10);
  });
  const band = out.map((channel) => converterBand(channel, sampleRate));
  const peak = Math.max(...band.map((channel) => channel.reduce((p, x) => Math.max(p, Math.abs(x)), 0)));
  const gain = dbToGain(peakDbfs) / peak;
  return band.map((channel) => channel.map((x) => x * gain));
}

/** Steady pink noise (sox `pinknoise`) on every channel, independent per channel, at `levelDbfs` RMS. */
export function noiseTake(seconds: number, sampleRate: number, channels: number, levelDbfs: number, seed: number): Float64Array[] {
  return Array.from({ length: channels }, (_, c) => roomTone(Math.round(seconds * sampleRate), sampleRate, levelDbfs, seed + c));
}

/**
 * A dense master that never falls quiet: the music-like material over a loud sustained bed (pink-ish
 * noise 14 dB under the peak level, like a pad, cymbals and reverb), squashed by sox's compander.
 */
export function denseMasterTake(seconds: number, sampleRate: number, peakDbfs: number, seed: number): Float64Array[] {
  const music = musicTake(seconds, sampleRate, -6, seed);
  const bed = music.map((channel, c) => roomTone(channel.length, sampleRate, -20, seed + 40 + c));
  const mixed = music.map((channel, c) => mixInto(channel.slice(), bed[c]));
  const peak = Math.max(...mixed.map((channel) => channel.reduce((p, x) => Math.max(p, Math.abs(x)), 0)));
  return mixed.map((channel) => channel.map((x) => (x * dbToGain(peakDbfs)) / peak));
}

/**
 * A full-band electronic master: the music-like material with digitally made hi-hats (white-noise bursts
 * decaying over 60 ms, every 125 ms, with no low-pass), so the content runs right up to Nyquist.
 */
export function fullBandMasterTake(seconds: number, sampleRate: number, peakDbfs: number, seed: number): Float64Array[] {
  const random = seededRandom(seed);
  const music = musicTake(seconds, sampleRate, -6, seed);
  const step = Math.round(0.125 * sampleRate);
  const decay = Math.exp(-1 / (0.015 * sampleRate));
  const hats = new Float64Array(music[0].length);
  for (let start = 0; start < hats.length; start += step) {
    let envelope = 0.25 * (0.5 + random());
    for (let i = start; i < Math.min(hats.length, start + step); i++, envelope *= decay) hats[i] = envelope * (2 * random() - 1);
  }
  const mixed = music.map((channel, c) => mixInto(channel.slice(), hats, c === 0 ? 1 : 0.8));
  const peak = Math.max(...mixed.map((channel) => channel.reduce((p, x) => Math.max(p, Math.abs(x)), 0)));
  return mixed.map((channel) => channel.map((x) => (x * dbToGain(peakDbfs)) / peak));
}

/** A sine sweep (sox `synth sine 20-20000`, the form that dwells longest at the bottom) at `peakDbfs`, over room tone. */
export function sweepTake(seconds: number, sampleRate: number, peakDbfs: number, seed: number): Float64Array {
  const sweep = synthesise(seconds, ['sine', '20-20000'], sampleRate, 1, ['gain', '-n', String(peakDbfs)])[0];
  return mixInto(sweep, roomTone(sweep.length, sampleRate, -75, seed));
}
