import type { Finding } from '../../dsp/types';
import { dbToAmplitude, sine } from '../../tests/support/testSignals';
import type { SampleCoding } from '../../tests/support/wavWriter';
import * as fault from './faults';
import { LINES, VOICES, conversationTake, denseMasterTake, fullBandMasterTake, mixInto, musicTake, noiseTake, roomTone, speechTake, sweepTake } from './material';
import { resample, speak } from './tools';

/**
 * The evaluation corpus: clean takes of several kinds, rates and formats, and the same kinds of
 * material with one planted fault each, of a stated size, with where it must be found.
 */

export interface TakeAudio {
  channels: Float64Array[];
  sampleRate: number;
  coding: SampleCoding;
  /** WAVE_FORMAT_EXTENSIBLE channel mask. */
  extensibleMask?: number;
  /** Track names for an iXML TRACK_LIST. */
  trackNames?: string[];
}

/** Where a planted fault must be reported. */
export interface Expectation {
  /** Any of these checks counts (a fault some specs call by another name). */
  checks: Finding['check'][];
  channel?: number;
  /** The fault's time span, seconds; a finding must touch it (±0.5 s). */
  fromSec?: number;
  toSec?: number;
}

export interface EvalTake {
  id: string;
  /** What the take is, and the fault's size. */
  description: string;
  /** Row of the evaluation table the fault belongs to (clean takes have none). */
  row?: string;
  expect?: Expectation;
  /** Part of the quick slice that `npm test` runs. */
  slice: boolean;
  make(): TakeAudio;
}

const [m3, f3, scot, rp, caribbean, , f4] = VOICES;
const CONVERSATION_LINES: [string, string][] = [
  [LINES[0], LINES[2]],
  [LINES[3], LINES[4]],
  [LINES[5], LINES[1]],
];

export const mono = (signal: Float64Array, sampleRate: number, coding: SampleCoding): TakeAudio => ({ channels: [signal], sampleRate, coding });

function speech(voiceIndex: number, lineIndex: number, sampleRate: number, peakDbfs: number, roomToneDbfs = -66, roomPercent = 25): Float64Array {
  return speechTake({ voice: VOICES[voiceIndex], line: LINES[lineIndex], sampleRate, peakDbfs, roomToneDbfs, roomPercent, seed: 100 * voiceIndex + lineIndex });
}

function conversation(index: number, sampleRate: number, peakDbfs: number, bleedDb: number, bleedDelaySec: number): Float64Array[] {
  const pairs: [typeof m3, typeof m3][] = [[m3, f3], [scot, rp], [caribbean, f4]];
  return conversationTake({ voices: pairs[index], lines: CONVERSATION_LINES[index], sampleRate, peakDbfs, bleedDb, bleedDelaySec, seed: 7 + index });
}

/** A location recorder's poly take: mix L/R, boom, two lavaliers, and unused tracks (digital zero, or an open input's hiss). */
function polyTake(sampleRate: number, unused: ('zero' | number)[], seed: number): { channels: Float64Array[]; names: string[] } {
  const [lavA, lavB] = conversation(0, sampleRate, -8, -26, 0.004);
  const frames = lavA.length;
  const boom = roomTone(frames, sampleRate, -62, seed);
  mixInto(boom, lavA, 0.5);
  mixInto(boom, lavB, 0.45);
  const mixL = lavA.map((x, i) => 0.7 * x + 0.4 * lavB[i]);
  const mixR = lavA.map((x, i) => 0.4 * x + 0.7 * lavB[i]);
  const channels = [mixL, mixR, boom, lavA, lavB];
  const names = ['MixL', 'MixR', 'Boom', 'Lav Anna', 'Lav Ben'];
  unused.forEach((kind, index) => {
    channels.push(kind === 'zero' ? new Float64Array(frames) : fault.openInputHiss(frames, kind, seed + index));
    names.push(`Lav ${index + 3}`);
  });
  return { channels, names };
}

/** A 997 Hz line-up tone at -18 dBFS (EBU R 68 alignment level) for `seconds`, then `rest`. */
function toneThen(rest: Float64Array, sampleRate: number, seconds: number, toneRate = sampleRate): Float64Array {
  const tone = sine(997 * (toneRate === sampleRate ? 1 : sampleRate / toneRate), dbToAmplitude(-18), seconds, sampleRate);
  const out = new Float64Array(tone.length + Math.round(0.5 * sampleRate) + rest.length);
  out.set(tone);
  out.set(rest, tone.length + Math.round(0.5 * sampleRate));
  return mixInto(out, roomTone(out.length, sampleRate, -70, 77));
}

/** Speech made at a low rate (a phone or a narrowband codec) and converted up, with nothing above its old Nyquist. */
function narrowbandSpeech(sourceRate: number, sampleRate: number): Float64Array {
  const up = resample(speak(LINES[2], m3, sourceRate, -6), sourceRate, sampleRate);
  const take = new Float64Array(up.length + sampleRate);
  mixInto(take, up, 1, Math.round(0.5 * sampleRate));
  // The room tone of the far end came through the same narrow channel.
  return mixInto(take, resample(roomTone(take.length, sourceRate, -60, 31), sourceRate, sampleRate).subarray(0, take.length));
}

export const CLEAN_TAKES: EvalTake[] = [
  { id: 'speech-low-male-48k-24', description: 'speech, low male voice (en-gb m3), peak -6 dBFS, 48 kHz 24-bit mono', slice: true, make: () => mono(speech(0, 0, 48000, -6), 48000, 'pcm24') },
  { id: 'speech-female-48k-24', description: 'speech, female voice (en-us f3), peak -3 dBFS, 48 kHz 24-bit mono', slice: false, make: () => mono(speech(1, 1, 48000, -3), 48000, 'pcm24') },
  { id: 'speech-deep-96k-24', description: 'speech, deep slow voice (en-gb-scotland m1), peak -2 dBFS, 96 kHz 24-bit mono', slice: true, make: () => mono(speech(2, 2, 96000, -2), 96000, 'pcm24') },
  { id: 'speech-rp-44k-16', description: 'speech, fast high voice (en-gb-x-rp f2), peak -10 dBFS, 44.1 kHz 16-bit mono', slice: true, make: () => mono(fault.quantise(speech(3, 3, 44100, -10), 16), 44100, 'pcm16') },
  { id: 'speech-caribbean-48k-float', description: 'speech (en-029 m2), peak -4 dBFS, 48 kHz 32-bit float mono', slice: true, make: () => mono(speech(4, 4, 48000, -4), 48000, 'float32') },
  { id: 'speech-very-deep-96k-float', description: 'speech, very deep slow voice (en-us m7), peak -1.5 dBFS, 96 kHz float mono', slice: true, make: () => mono(speech(5, 5, 96000, -1.5), 96000, 'float32') },
  { id: 'speech-quiet-48k-16', description: 'speech, high voice (en-gb f4), quiet: peak -20 dBFS, 48 kHz 16-bit mono', slice: false, make: () => mono(fault.quantise(speech(6, 0, 48000, -20, -78), 16), 48000, 'pcm16') },
  { id: 'speech-low-male-44k-24-loud', description: 'speech, low male voice, loud: peak -1 dBFS, 44.1 kHz 24-bit mono', slice: false, make: () => mono(speech(0, 3, 44100, -1), 44100, 'pcm24') },
  { id: 'speech-booth-very-deep-96k-float', description: 'speech in a dead booth (no reverberation), very deep voice (en-us m7), peak -1 dBFS, 96 kHz float mono', slice: true, make: () => mono(speech(5, 2, 96000, -1, -72, 0), 96000, 'float32') },
  { id: 'speech-booth-low-male-96k-24', description: 'speech in a dead booth, low male voice (en-gb m3), peak -3 dBFS, 96 kHz 24-bit mono', slice: false, make: () => mono(speech(0, 5, 96000, -3, -70, 0), 96000, 'pcm24') },
  { id: 'speech-booth-scottish-48k-16', description: 'speech in a dead booth, deep voice (en-gb-scotland m1), peak -20 dBFS, 48 kHz 16-bit mono', slice: false, make: () => mono(fault.quantise(speech(2, 4, 48000, -20, -80, 0), 16), 48000, 'pcm16') },
  { id: 'conversation-48k-24', description: 'two-mic conversation (m3 + f3), bleed -14 dB at 2.5 ms, 48 kHz 24-bit stereo', slice: true, make: () => ({ channels: conversation(0, 48000, -5, -14, 0.0025), sampleRate: 48000, coding: 'pcm24' }) },
  { id: 'conversation-44k-16', description: 'two-mic conversation (m1 + f2), bleed -20 dB at 4 ms, 44.1 kHz 16-bit stereo', slice: true, make: () => ({ channels: conversation(1, 44100, -6, -20, 0.004).map((c) => fault.quantise(c, 16)), sampleRate: 44100, coding: 'pcm16' }) },
  { id: 'conversation-96k-float', description: 'two-mic conversation (m2 + f4), bleed -10 dB at 1.5 ms, 96 kHz float stereo', slice: false, make: () => ({ channels: conversation(2, 96000, -3, -10, 0.0015), sampleRate: 96000, coding: 'float32' }) },
  { id: 'music-48k-24', description: 'music-like (sox plucked chords and pad, panned), peak -3 dBFS, 48 kHz 24-bit stereo', slice: true, make: () => ({ channels: musicTake(12, 48000, -3, 1), sampleRate: 48000, coding: 'pcm24' }) },
  { id: 'music-44k-16', description: 'music-like, peak -1.5 dBFS, 44.1 kHz 16-bit stereo', slice: false, make: () => ({ channels: musicTake(12, 44100, -1.5, 2).map((c) => fault.quantise(c, 16)), sampleRate: 44100, coding: 'pcm16' }) },
  { id: 'music-96k-float', description: 'music-like, peak -6 dBFS, 96 kHz float stereo', slice: false, make: () => ({ channels: musicTake(10, 96000, -6, 3), sampleRate: 96000, coding: 'float32' }) },
  { id: 'ambience-48k-24', description: 'steady ambience (independent pink-ish noise per channel) at -30 dBFS RMS, 48 kHz 24-bit stereo', slice: true, make: () => ({ channels: noiseTake(10, 48000, 2, -30, 5), sampleRate: 48000, coding: 'pcm24' }) },
  { id: 'room-tone-48k-24', description: 'room tone only (for editing), -63 dBFS RMS, 48 kHz 24-bit mono', slice: true, make: () => mono(roomTone(48000 * 10, 48000, -63, 9), 48000, 'pcm24') },
  { id: 'surround-5.1-48k-24', description: 'music-like on L R C Ls Rs, LFE low-passed, channel mask 0x3F, 48 kHz 24-bit', slice: true, make: () => surround() },
  { id: 'poly-8-48k-24', description: 'location recorder poly: mix L/R, boom, two lavaliers, three unused tracks (digital zero, hiss at -95 and -85 dBFS), iXML names, 48 kHz 24-bit', slice: true, make: () => { const { channels, names } = polyTake(48000, ['zero', -95, -85], 3); return { channels, sampleRate: 48000, coding: 'pcm24', trackNames: names }; } },
  { id: 'poly-4-96k-float', description: 'poly: boom, two lavaliers, one unused (hiss at -90 dBFS), iXML names, 96 kHz float', slice: false, make: () => { const { channels, names } = polyTake(96000, [-90], 4); return { channels: channels.slice(2), sampleRate: 96000, coding: 'float32', trackNames: names.slice(2) }; } },
  { id: 'dense-master-48k-24', description: 'dense music master with no quiet passage (music over a loud bed), peak -1 dBFS, 48 kHz 24-bit stereo', slice: true, make: () => ({ channels: denseMasterTake(12, 48000, -1, 12), sampleRate: 48000, coding: 'pcm24' }) },
  { id: 'full-band-master-48k-24', description: 'full-band electronic master (music-like with digital white-noise hi-hats, no low-pass), peak -1 dBFS, 48 kHz 24-bit stereo', slice: true, make: () => ({ channels: fullBandMasterTake(10, 48000, -1, 15), sampleRate: 48000, coding: 'pcm24' }) },
  { id: 'sweep-48k-24', description: 'sine sweep 20 Hz - 20 kHz (sox) at -12 dBFS over room tone, 48 kHz 24-bit mono', slice: true, make: () => mono(sweepTake(20, 48000, -12, 13), 48000, 'pcm24') },
  { id: 'tone-only-48k-24', description: '997 Hz line-up tone at -18 dBFS only, 10 s over room tone at -80 dBFS, 48 kHz 24-bit mono', slice: true, make: () => mono(mixInto(sine(997, dbToAmplitude(-18), 10, 48000), roomTone(480000, 48000, -80, 14)), 48000, 'pcm24') },
  { id: 'tone-then-speech-48k-24', description: '997 Hz line-up tone at -18 dBFS for 3 s, then speech, 48 kHz 24-bit mono', slice: false, make: () => mono(toneThen(speech(1, 2, 48000, -8), 48000, 3), 48000, 'pcm24') },
];

function surround(): TakeAudio {
  const [l, r, c, ls, rs] = musicTake(10, 48000, -6, 11, 5);
  const lfe = c.slice();
  // One-pole low-pass at 120 Hz for the LFE feed.
  const pole = Math.exp((-2 * Math.PI * 120) / 48000);
  for (let i = 1; i < lfe.length; i++) lfe[i] = pole * lfe[i - 1] + (1 - pole) * lfe[i];
  return { channels: [l, r, c, lfe, ls, rs], sampleRate: 48000, coding: 'pcm24', extensibleMask: 0x3f };
}

/** A burst of fs/4 sine at 45 degrees phase: its samples stay at 0.707 of its true peak (BS.1770 Annex 2 worst case). */
function interSampleBurst(signal: Float64Array, sampleRate: number, atSec: number, truePeakDbfs: number): Float64Array {
  const start = Math.round(atSec * sampleRate);
  const amplitude = dbToAmplitude(truePeakDbfs);
  for (let n = 0; n < Math.round(0.02 * sampleRate); n++) signal[start + n] = amplitude * Math.sin((Math.PI / 2) * n + Math.PI / 4);
  return signal;
}

/** Speech at 48 kHz with a tone at its head recorded at 44.1 kHz but labelled 48 kHz: the 997 Hz tone reads 1085 Hz. */
function wrongRateTake(): TakeAudio {
  return mono(toneThen(speech(0, 5, 48000, -8), 48000, 3, 44100), 48000, 'pcm24');
}

const MIX_TRACK = 4;

export const FAULT_TAKES: EvalTake[] = [
  { id: 'clip-below-20-speech-48k-24', row: 'clipping below full scale', description: 'flat tops at -20 dBFS (driven 6 dB past the clip), converter noise -105 dBFS, 3-5 s', slice: true, expect: { checks: ['clipping'], channel: 0, fromSec: 3, toSec: 5 },
    make: () => mono(fault.clipBeforeConverter(speech(0, 0, 48000, -10), 48000, 3, 5, -20, 6, -105, 1), 48000, 'pcm24') },
  { id: 'clip-below-12-speech-96k-24', row: 'clipping below full scale', description: 'flat tops at -12 dBFS (driven 4 dB past), noise -100 dBFS, deep voice at 96 kHz, 4-6 s', slice: false, expect: { checks: ['clipping'], channel: 0, fromSec: 4, toSec: 6 },
    make: () => mono(fault.clipBeforeConverter(speech(2, 2, 96000, -6), 96000, 4, 6, -12, 4, -100, 2), 96000, 'pcm24') },
  { id: 'clip-below-3-speech-44k-16', row: 'clipping below full scale', description: 'flat tops at -3 dBFS (driven 8 dB past), 16-bit, 2-4 s', slice: true, expect: { checks: ['clipping'], channel: 0, fromSec: 2, toSec: 4 },
    make: () => mono(fault.quantise(fault.clipBeforeConverter(speech(3, 3, 44100, -6), 44100, 2, 4, -3, 8, -100, 3), 16), 44100, 'pcm16') },
  { id: 'clip-below-9-through-converter-48k', row: 'clipping below full scale', description: 'analogue clip then the converter\'s anti-alias filter (rippled flat tops) at -9 dBFS, driven 8 dB past, noise -105 dBFS, 3-6 s', slice: true, expect: { checks: ['clipping'], channel: 0, fromSec: 3, toSec: 6 },
    make: () => mono(fault.clipBeforeConverter(speech(1, 4, 48000, -10), 48000, 3, 6, -9, 8, -105, 6, true), 48000, 'pcm24') },
  { id: 'clip-below-18-through-converter-96k', row: 'clipping below full scale', description: 'analogue clip through a 96 kHz converter\'s filter at -18 dBFS, driven 6 dB past, deep voice, 2-5 s', slice: false, expect: { checks: ['clipping'], channel: 0, fromSec: 2, toSec: 5 },
    make: () => mono(fault.clipBeforeConverter(speech(5, 3, 96000, -10), 96000, 2, 5, -18, 6, -110, 7, true), 96000, 'pcm24') },
  { id: 'clip-below-6-conversation-right', row: 'clipping below full scale', description: 'flat tops at -6 dBFS on the right microphone only (driven 5 dB past), 6-8 s', slice: false, expect: { checks: ['clipping'], channel: 1, fromSec: 6, toSec: 8 },
    make: () => { const channels = conversation(0, 48000, -5, -14, 0.0025); fault.clipBeforeConverter(channels[1], 48000, 6, 8, -6, 5, -110, 4); return { channels, sampleRate: 48000, coding: 'pcm24' }; } },
  { id: 'clip-below-10-poly-lav', row: 'clipping below full scale', description: 'flat tops at -10 dBFS on the poly take\'s "Lav Ben" track (driven 6 dB past), 5-7 s', slice: true, expect: { checks: ['clipping'], channel: MIX_TRACK, fromSec: 5, toSec: 7 },
    make: () => { const { channels, names } = polyTake(48000, ['zero'], 5); fault.clipBeforeConverter(channels[MIX_TRACK], 48000, 5, 7, -10, 6, -108, 5); return { channels, sampleRate: 48000, coding: 'pcm24', trackNames: names }; } },
  { id: 'clip-full-music-48k-24', row: 'clipping at full scale', description: 'music driven 6 dB past full scale, 4-5 s, both channels', slice: true, expect: { checks: ['clipping'], fromSec: 4, toSec: 5 },
    make: () => { const channels = musicTake(12, 48000, -3, 1); for (const channel of channels) fault.overload(channel, 48000, 4, 5, 6); return { channels, sampleRate: 48000, coding: 'pcm24' }; } },
  { id: 'clip-full-speech-44k-16', row: 'clipping at full scale', description: 'speech driven 3 dB past full scale, 2-4 s, 16-bit', slice: false, expect: { checks: ['clipping'], channel: 0, fromSec: 2, toSec: 4 },
    make: () => mono(fault.quantise(fault.overload(speech(4, 1, 44100, -6), 44100, 2, 4, 3), 16), 44100, 'pcm16') },
  { id: 'true-peak-over-music', row: 'true-peak over', description: 'a 20 ms inter-sample burst with a true peak of +1.5 dBTP (samples at -1.5 dBFS) at 5 s, left channel', slice: true, expect: { checks: ['true-peak'], channel: 0, fromSec: 5, toSec: 5.1 },
    make: () => { const channels = musicTake(12, 48000, -6, 1); interSampleBurst(channels[0], 48000, 5, 1.5); return { channels, sampleRate: 48000, coding: 'pcm24' }; } },
  { id: 'dropout-20ms-speech', row: 'dropout', description: '20 ms of digital silence at 4.0 s in speech', slice: true, expect: { checks: ['dropout'], fromSec: 4, toSec: 4.02 },
    make: () => mono(fault.dropout([speech(1, 1, 48000, -6)], 48000, 4, 0.02)[0], 48000, 'pcm24') },
  { id: 'dropout-8ms-music', row: 'dropout', description: '8 ms of digital silence at 3.2 s in stereo music', slice: false, expect: { checks: ['dropout'], fromSec: 3.2, toSec: 3.208 },
    make: () => ({ channels: fault.dropout(musicTake(10, 44100, -3, 4), 44100, 3.2, 0.008), sampleRate: 44100, coding: 'pcm24' }) },
  { id: 'dropout-50ms-conversation', row: 'dropout', description: '50 ms of digital silence at 7.5 s in a two-mic conversation', slice: false, expect: { checks: ['dropout'], fromSec: 7.5, toSec: 7.55 },
    make: () => ({ channels: fault.dropout(conversation(1, 48000, -6, -20, 0.004), 48000, 7.5, 0.05), sampleRate: 48000, coding: 'pcm24' }) },
  { id: 'dc-0.3pc-speech', row: 'DC offset', description: 'steady DC offset of 0.3 % of full scale (-50 dBFS) in speech', slice: true, expect: { checks: ['dc-offset'], channel: 0 },
    make: () => mono(fault.dcOffset(speech(0, 4, 48000, -6), 0.003), 48000, 'pcm24') },
  { id: 'dc-2pc-conversation-right', row: 'DC offset', description: 'steady DC offset of 2 % on the right microphone of a conversation', slice: false, expect: { checks: ['dc-offset'], channel: 1 },
    make: () => { const channels = conversation(2, 48000, -5, -10, 0.0015); fault.dcOffset(channels[1], 0.02); return { channels, sampleRate: 48000, coding: 'pcm24' }; } },
  { id: 'dead-zero-conversation-right', row: 'dead channel (digital zero)', description: 'right microphone channel all digital zero', slice: true, expect: { checks: ['silent-channel'], channel: 1 },
    make: () => { const channels = conversation(0, 48000, -5, -14, 0.0025); channels[1].fill(0); return { channels, sampleRate: 48000, coding: 'pcm24' }; } },
  { id: 'dead-hiss-90-music-left', row: 'dead channel (open-input hiss)', description: 'left channel only an open input\'s hiss at -90 dBFS RMS', slice: true, expect: { checks: ['silent-channel'], channel: 0 },
    make: () => { const channels = musicTake(10, 48000, -3, 5); channels[0] = fault.openInputHiss(channels[0].length, -90, 6); return { channels, sampleRate: 48000, coding: 'pcm24' }; } },
  { id: 'dead-hiss-75-conversation-left', row: 'dead channel (open-input hiss)', description: 'left channel only hiss at -75 dBFS RMS (a high-gain open input), 44.1 kHz 16-bit', slice: false, expect: { checks: ['silent-channel'], channel: 0 },
    make: () => { const channels = conversation(1, 44100, -6, -20, 0.004); channels[0] = fault.openInputHiss(channels[0].length, -75, 7); return { channels: channels.map((c) => fault.quantise(c, 16)), sampleRate: 44100, coding: 'pcm16' }; } },
  { id: 'dead-hiss-85-surround-ls', row: 'dead channel (open-input hiss)', description: 'Ls channel of a 5.1 take only hiss at -85 dBFS RMS', slice: false, expect: { checks: ['silent-channel'], channel: 4 },
    make: () => { const take = surround(); take.channels[4] = fault.openInputHiss(take.channels[4].length, -85, 8); return take; } },
  { id: 'polarity-music-right', row: 'polarity inversion', description: 'right channel of stereo music polarity-inverted', slice: true, expect: { checks: ['stereo'] },
    make: () => { const channels = musicTake(12, 48000, -3, 6); fault.invert(channels[1]); return { channels, sampleRate: 48000, coding: 'pcm24' }; } },
  { id: 'polarity-conversation-right', row: 'polarity inversion', description: 'right microphone of a two-mic conversation (bleed -14 dB at 2.5 ms) polarity-inverted', slice: true, expect: { checks: ['stereo'] },
    make: () => { const channels = conversation(0, 48000, -5, -14, 0.0025); fault.invert(channels[1]); return { channels, sampleRate: 48000, coding: 'pcm24' }; } },
  { id: 'hum-50-speech', row: 'hum under speech', description: '50 Hz hum with harmonics, fundamental at -50 dBFS, under speech', slice: true, expect: { checks: ['hum'] },
    make: () => mono(fault.hum(speech(2, 0, 48000, -6), 48000, 50, -50), 48000, 'pcm24') },
  { id: 'hum-60-conversation', row: 'hum under speech', description: '60 Hz hum, fundamental at -55 dBFS, on both microphones of a conversation', slice: false, expect: { checks: ['hum'] },
    make: () => ({ channels: conversation(0, 48000, -5, -14, 0.0025).map((c) => fault.hum(c, 48000, 60, -55)), sampleRate: 48000, coding: 'pcm24' }) },
  { id: 'upsampled-8k-speech', row: 'low bandwidth / upsampled', description: 'speech made at 8 kHz and converted up to 48 kHz', slice: true, expect: { checks: ['sample-rate', 'bandwidth'] },
    make: () => mono(narrowbandSpeech(8000, 48000), 48000, 'pcm24') },
  { id: 'upsampled-22k-speech', row: 'low bandwidth / upsampled', description: 'speech made at 22.05 kHz and converted up to 96 kHz', slice: false, expect: { checks: ['sample-rate', 'bandwidth'] },
    make: () => mono(narrowbandSpeech(22050, 96000), 96000, 'pcm24') },
  { id: '16-in-24-speech', row: '16-bit audio in a 24-bit file', description: 'speech rounded to 16-bit codes in a 24-bit container', slice: true, expect: { checks: ['resolution'] },
    make: () => mono(fault.quantise(speech(4, 2, 48000, -6), 16), 48000, 'pcm24') },
  { id: 'wrong-rate-tone', row: 'wrong declared rate (tone)', description: '997 Hz line-up tone recorded at 44.1 kHz in a file labelled 48 kHz (reads 1085 Hz), 0-3 s', slice: true, expect: { checks: ['sample-rate'], fromSec: 0, toSec: 3 },
    make: wrongRateTake },
  { id: 'nan-speech-float', row: 'NaN / infinite samples', description: '3 NaN samples at 2.5 s in float speech', slice: true, expect: { checks: ['non-finite'], channel: 0, fromSec: 2.5, toSec: 2.5 },
    make: () => mono(fault.poison(speech(1, 3, 48000, -6), 48000, 2.5, 3, Number.NaN), 48000, 'float32') },
  { id: 'all-nan-float', row: 'NaN / infinite samples', description: 'a float take whose every sample is NaN', slice: false, expect: { checks: ['non-finite'], fromSec: 0, toSec: 0 },
    make: () => mono(new Float64Array(48000 * 5).fill(Number.NaN), 48000, 'float32') },
  { id: 'inf-conversation-float', row: 'NaN / infinite samples', description: 'one +Inf sample at 1.7 s on the right channel of a float conversation', slice: false, expect: { checks: ['non-finite'], channel: 1, fromSec: 1.7, toSec: 1.7 },
    make: () => { const channels = conversation(2, 48000, -5, -10, 0.0015); fault.poison(channels[1], 48000, 1.7, 1, Number.POSITIVE_INFINITY); return { channels, sampleRate: 48000, coding: 'float32' }; } },
  { id: 'over-full-scale-float', row: 'float over full scale', description: 'float speech gained to +3 dBFS from 3 to 4 s (not clipped)', slice: true, expect: { checks: ['over-full-scale'], fromSec: 3, toSec: 4 },
    make: () => mono(fault.floatOverFullScale(speech(0, 1, 48000, -6), 48000, 3, 4, 3), 48000, 'float32') },
  { id: 'loud-music', row: 'loudness outside the target', description: 'music at a sample peak of -0.5 dBFS (about 11 LU over the -23 LUFS target)', slice: false, expect: { checks: ['loudness'] },
    make: () => ({ channels: musicTake(12, 48000, -0.5, 8), sampleRate: 48000, coding: 'pcm24' }) },
  { id: 'quiet-speech', row: 'loudness outside the target', description: 'speech at a peak of -32 dBFS (about 20 LU under the target)', slice: true, expect: { checks: ['loudness'] },
    make: () => mono(speech(5, 1, 48000, -32, -90), 48000, 'pcm24') },
  { id: 'noisy-room-speech', row: 'noise floor', description: 'speech over room noise at -45 dBFS RMS', slice: false, expect: { checks: ['noise-floor'] },
    make: () => mono(fault.noisyRoom(speech(6, 2, 48000, -6), 48000, -45, 12), 48000, 'pcm24') },
];

