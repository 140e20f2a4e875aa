import { seededRandom } from '../../tests/support/testSignals';
import { normalisePeak } from './faults';
import { airBand, conversationTake, mixInto, roomTone, speechTake } from './material';
import { converterBand, resample, soxProcess, speak, synthesise, type Voice } from './tools';

/**
 * More realistic clean material, of kinds the first corpus does not hold: voices in other languages,
 * variants, pitches and rates (espeak-ng); speech from a flat microphone with no low cut; narrowband
 * speech converted up; sox-synthesised pieces with plucked, sine and square-wave chords through
 * reverb and compand, a loud limited master and a quiet acoustic-like piece.
 */

export interface SpokenLine {
  voice: Voice;
  line: string;
}

/** Invented lines, each with a voice of its language [espeak-ng voices and variants, pitches 20-80, rates 120-220]. */
export const SPOKEN_LINES: SpokenLine[] = [
  { voice: { name: 'en+m3', rate: 205, pitch: 35 }, line: 'Good evening from the north pier. The ferry is late again, and the gulls have found the fish van, so we will keep this short and sweet.' },
  { voice: { name: 'en+f2', rate: 125, pitch: 75 }, line: 'Chapter three. The clock in the hall stopped at ten past four, and nobody in the house could remember who had wound it last.' },
  { voice: { name: 'de+m4', rate: 150, pitch: 25 }, line: 'Guten Abend und willkommen zur Sendung. Heute sprechen wir über den alten Bahnhof am Fluss und über die Menschen, die dort jeden Morgen den Kaffee kochen.' },
  { voice: { name: 'fr+f1', rate: 180, pitch: 65 }, line: 'Bonsoir à tous. Ce soir, nous partons sur les petites routes de la côte, entre les marais salants et les phares, à la rencontre de ceux qui réparent encore les filets.' },
  { voice: { name: 'es+m2', rate: 220, pitch: 40 }, line: 'Buenas tardes y bienvenidos. Hoy visitamos el mercado del barrio viejo, donde las panaderas empiezan a trabajar antes de que salga el sol.' },
  { voice: { name: 'de+f5', rate: 135, pitch: 55 }, line: 'Szene sieben, Aufnahme drei. Er öffnet das Fenster, hört auf den Regen und sagt eine ganze Minute lang kein einziges Wort.' },
  { voice: { name: 'fr+m1', rate: 120, pitch: 20 }, line: 'Numéro douze, la porte verte. Sonnez deux fois, attendez un peu, puis laissez le paquet chez la voisine du premier étage.' },
  { voice: { name: 'es+f3', rate: 165, pitch: 80 }, line: 'El tren de las ocho llega siempre tarde. Nadie se queja, porque desde la ventana se ve el mar y el café de la estación es muy bueno.' },
];

export interface VoiceTakeOptions {
  sampleRate: number;
  peakDbfs: number;
  roomToneDbfs: number;
  seed: number;
  roomPercent?: number;
  lowCutHz?: number;
}

/** One of SPOKEN_LINES on one microphone in a room. */
export function voiceTake(index: number, options: VoiceTakeOptions): Float64Array {
  const { voice, line } = SPOKEN_LINES[index];
  return speechTake({ voice, line, ...options });
}

/** Two of SPOKEN_LINES as a two-microphone conversation, each voice bleeding into the other's microphone. */
export function twoMicTake(first: number, second: number, sampleRate: number, peakDbfs: number, bleedDb: number, bleedDelaySec: number, seed: number): Float64Array[] {
  const [a, b] = [SPOKEN_LINES[first], SPOKEN_LINES[second]];
  return conversationTake({ voices: [a.voice, b.voice], lines: [a.line, b.line], sampleRate, peakDbfs, bleedDb, bleedDelaySec, seed });
}

/**
 * Speech that came through a narrow channel (a phone line, a codec at `sourceRate`) and was converted up
 * to `sampleRate`, then recorded through the studio's own converter (its noise is full band).
 */
export function narrowbandVoiceTake(index: number, sourceRate: number, sampleRate: number, peakDbfs: number, seed: number): Float64Array {
  const { voice, line } = SPOKEN_LINES[index];
  const narrow = resample(speak(line, voice, sourceRate, peakDbfs), sourceRate, sampleRate);
  const lineNoise = resample(roomTone(Math.round((narrow.length * sourceRate) / sampleRate), sourceRate, -62, seed), sourceRate, sampleRate);
  const take = new Float64Array(narrow.length + sampleRate);
  mixInto(take, narrow, 1, Math.round(0.5 * sampleRate));
  mixInto(take, lineNoise, 1, Math.round(0.5 * sampleRate));
  return mixInto(take, roomTone(take.length, sampleRate, -84, seed + 1));
}

export type Instrument = 'pluck' | 'sine' | 'square';

export interface PieceOptions {
  seconds: number;
  sampleRate: number;
  channels: number;
  peakDbfs: number;
  seed: number;
  instrument: Instrument;
  /** Seconds per chord. */
  beatSec: number;
  /** Reverberance of the room, percent. */
  reverbPercent: number;
  /** sox `compand` arguments applied to the whole mix (a bus compressor or a limiter); none when absent. */
  compand?: string[];
  /** Kick and hi-hat under the chords. */
  drums?: boolean;
  /** Room tone under the piece, dBFS RMS. */
  roomToneDbfs: number;
}

const CHORDS = [[261.6, 329.6, 392], [220, 261.6, 329.6], [174.6, 220, 261.6], [196, 246.9, 293.7], [146.8, 174.6, 220]];

/** One part of a piece: a note or chord per beat from `make`, placed one after another. */
function sequence(seconds: number, sampleRate: number, beatSec: number, make: (beat: number) => Float64Array): Float64Array {
  const out = new Float64Array(Math.round(seconds * sampleRate));
  for (let beat = 0; beat * beatSec < seconds; beat++) mixInto(out, make(beat), 1, Math.round(beat * beatSec * sampleRate));
  return out;
}

/**
 * A music-like piece from sox's synthesiser: chords (plucked, sine or square-wave through a low-pass, as
 * a synthesiser patch), a bass line and optionally drums, panned, through a stereo reverb and an
 * optional compand, the converter's band limit, room tone, and levelled to `peakDbfs` sample peak.
 */
export function pieceTake(options: PieceOptions): Float64Array[] {
  const { seconds, sampleRate, channels, beatSec, instrument, seed } = options;
  const random = seededRandom(seed);
  const chordOf = (beat: number) => CHORDS[(beat + Math.floor(random() * 2)) % CHORDS.length];
  const shape = instrument === 'pluck' ? [] : ['lowpass', '2500', 'fade', 'q', '0.02', String(beatSec), '0.15'];
  const chords = sequence(seconds, sampleRate, beatSec, (beat) => {
    const octave = random() < 0.3 ? 2 : 1;
    return synthesise(beatSec, chordOf(beat).flatMap((f) => [instrument, String(f * octave)]), sampleRate, 1, [...shape, 'gain', '-n', String(-4 - 5 * random())])[0];
  });
  const bass = sequence(seconds, sampleRate, 2 * beatSec, (beat) => synthesise(2 * beatSec, ['sine', String(CHORDS[beat % CHORDS.length][0] / 2)], sampleRate, 1, ['fade', 'q', '0.01', String(2 * beatSec), '0.3', 'gain', '-n', '-8'])[0]);
  const kickHit = synthesise(0.25, ['sine', '90:40'], sampleRate, 1, ['fade', 'q', '0.002', '0.25', '0.2', 'gain', '-n', '-5'])[0];
  const hatHit = synthesise(0.06, ['whitenoise'], sampleRate, 1, ['highpass', '7000', 'fade', 'q', '0.001', '0.06', '0.05', 'gain', '-n', '-14'])[0];
  const kick = options.drums ? sequence(seconds, sampleRate, beatSec, () => kickHit) : null;
  const hat = options.drums ? sequence(seconds, sampleRate, beatSec / 2, () => hatHit.map((x) => x * (0.5 + 0.5 * random()))) : null;
  const pans = Array.from({ length: channels }, (_, c) => (channels === 1 ? 0.5 : c / (channels - 1)));
  // Chords a little to one side and 0.4 ms later on the other (a spaced pair), bass and kick in the middle, the hi-hat to the other side.
  const delay = Math.round(0.0004 * sampleRate);
  const dry = pans.map((pan) => {
    const channel = new Float64Array(chords.length);
    mixInto(channel, chords, Math.cos((pan * Math.PI) / 2) * 0.8 + 0.2, pan > 0.5 ? delay : 0);
    mixInto(channel, bass, 0.7);
    if (kick) mixInto(channel, kick, 0.7);
    if (hat) mixInto(channel, hat, Math.sin((pan * Math.PI) / 2) * 0.8 + 0.2);
    return channel;
  });
  const effects = ['gain', '-16', 'reverb', String(options.reverbPercent), '50', '70', '100', '8', ...(options.compand ? ['compand', ...options.compand] : [])];
  const wet = soxProcess(dry, sampleRate, sampleRate, effects);
  const out = wet.map((channel) => converterBand(channel, sampleRate));
  normalisePeak(out, options.peakDbfs);
  return out.map((channel, c) => mixInto(channel, roomTone(channel.length, sampleRate, options.roomToneDbfs, seed + 20 + c)));
}

/** A loud limited master: a produced piece through a fast look-ahead compand that holds its peaks near one ceiling. */
export function limitedMaster(seconds: number, sampleRate: number, peakDbfs: number, seed: number): Float64Array[] {
  return pieceTake({
    seconds, sampleRate, channels: 2, peakDbfs, seed, instrument: 'square', beatSec: 0.5, reverbPercent: 30, drums: true, roomToneDbfs: -80,
    // attack,decay; transfer (soft knee 2 dB) flat to -12 dB, then at most -3 dB out; make-up 0; start at -20 dB; 3 ms look-ahead.
    compand: ['0.003,0.08', '2:-80,-80,-12,-8,0,-3', '0', '-20', '0.003'],
  });
}

/** A voice with the air band and room tone of speechTake, for mixing into a surround or poly take. */
export function voiceForMix(index: number, sampleRate: number, peakDbfs: number, seed: number): Float64Array {
  const speech = speak(SPOKEN_LINES[index].line, SPOKEN_LINES[index].voice, sampleRate, peakDbfs);
  return mixInto(speech.slice(), airBand(speech, sampleRate, -18, seed));
}

/** A stereo widener: L' = M + w·S, R' = M - w·S, then levelled back to `peakDbfs` (side content of panned sources comes out in anti-phase). */
export function widen([left, right]: Float64Array[], width: number, peakDbfs: number): Float64Array[] {
  const out = [left.map((x, i) => (x + right[i]) / 2 + (width * (x - right[i])) / 2), left.map((x, i) => (x + right[i]) / 2 - (width * (x - right[i])) / 2)];
  return normalisePeak(out, peakDbfs);
}

/**
 * A lead line of square-wave notes (a chiptune-style sting), made at four times the rate and converted
 * down as a soft synth's band-limited oscillator is (a raw square at the take's own rate would alias),
 * notes at three levels, over room tone.
 */
export function squareMelody(notes: number, sampleRate: number, seed: number): Float64Array {
  const random = seededRandom(seed);
  const scale = [220, 247, 262, 294, 330, 349, 392, 440];
  const synthRate = 4 * sampleRate;
  const line = sequence(notes * 0.3, synthRate, 0.3, () => synthesise(0.3, ['square', String(scale[Math.floor(random() * scale.length)])], synthRate, 1, ['gain', '-n', String(-6 - Math.floor(3 * random()))])[0]);
  const down = resample(line, synthRate, sampleRate);
  return mixInto(down, roomTone(down.length, sampleRate, -78, seed));
}

/**
 * A spaced pair (two microphones 1.5 m apart) on a small ensemble: a bass reaching the left microphone
 * 2 ms early, plucked chords the right one 3 ms early, a hi-hat the right one 4 ms early, through the
 * converter's band, room tone on each.
 */
export function spacedPairTake(seconds: number, sampleRate: number, peakDbfs: number, seed: number): Float64Array[] {
  const roots = [98, 110, 87.3, 82.4];
  const bass = sequence(seconds, sampleRate, 1, (beat) => synthesise(1, ['sine', String(roots[beat % roots.length])], sampleRate, 1, ['fade', 'q', '0.01', '1', '0.3', 'gain', '-n', '-6'])[0]);
  const chords = sequence(seconds, sampleRate, 0.5, (beat) => synthesise(0.5, CHORDS[beat % CHORDS.length].flatMap((f) => ['pluck', String(f)]), sampleRate, 1, ['gain', '-n', '-8'])[0]);
  const hatHit = synthesise(0.05, ['whitenoise'], sampleRate, 1, ['highpass', '6000', 'fade', 'q', '0.001', '0.05', '0.04', 'gain', '-n', '-20'])[0];
  const hat = sequence(seconds, sampleRate, 0.25, () => hatHit);
  const out = [new Float64Array(bass.length), new Float64Array(bass.length)];
  const place = (signal: Float64Array, leftEarlyMs: number) => {
    const delay = Math.round((Math.abs(leftEarlyMs) * sampleRate) / 1000);
    mixInto(out[0], signal, 1, leftEarlyMs > 0 ? 0 : delay);
    mixInto(out[1], signal, 1, leftEarlyMs > 0 ? delay : 0);
  };
  place(bass, 2);
  place(chords, -3);
  place(hat, -4);
  const band = out.map((channel, c) => mixInto(converterBand(channel, sampleRate), roomTone(channel.length, sampleRate, -70, seed + c)));
  return normalisePeak(band, peakDbfs);
}
