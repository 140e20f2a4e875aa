import type { SampleCoding } from '../../tests/support/wavWriter';
import { mono, type EvalTake, type TakeAudio } from './corpus';
import * as fault from './faults';
import { mixInto, noiseTake, roomTone } from './material';
import { limitedMaster, narrowbandVoiceTake, pieceTake, spacedPairTake, squareMelody, twoMicTake, voiceForMix, voiceTake, widen, type PieceOptions } from './varietyMaterial';

/**
 * A second corpus of realistic takes, unlike the first in voices (German, French, Spanish, English
 * variants; pitches 20-80, rates 120-220), microphones (no low cut), narrowband speech converted up,
 * produced and limited music, quiet acoustic music, a surround drama mix and an eight-track location
 * poly; with faults planted at the edges of detection (flat tops from -20 to -1 dBFS with converter
 * noise, small overloads, DC of 0.2 %, 5 ms dropouts, hiss at -90 dBFS as a dead channel).
 */

const quantised = (channels: Float64Array[], coding: SampleCoding) =>
  coding === 'pcm16' ? channels.map((channel) => fault.quantise(channel, 16)) : channels;
const take = (channels: Float64Array[], sampleRate: number, coding: SampleCoding): TakeAudio => ({ channels: quantised(channels, coding), sampleRate, coding });

const voice = (index: number, sampleRate: number, peakDbfs: number, extra: { roomToneDbfs?: number; roomPercent?: number; lowCutHz?: number } = {}) =>
  voiceTake(index, { sampleRate, peakDbfs, roomToneDbfs: extra.roomToneDbfs ?? -66, seed: 200 + index, roomPercent: extra.roomPercent, lowCutHz: extra.lowCutHz });

const piece = (options: Partial<PieceOptions> & Pick<PieceOptions, 'sampleRate' | 'instrument'>) =>
  pieceTake({ seconds: 14, channels: 2, peakDbfs: -3, seed: 31, beatSec: 0.6, reverbPercent: 50, roomToneDbfs: -74, ...options });

/** A bus compressor (gentle, slow) as a mix engineer puts on a music bus. */
const BUS_COMPAND = ['0.02,0.3', '6:-70,-70,-24,-20,0,-8', '0', '-20', '0.01'];

/** A quiet acoustic-like piece: plucked strings, a live room, no processing, peak -18 dBFS. */
const acoustic = (sampleRate: number) => piece({ sampleRate, instrument: 'pluck', beatSec: 0.9, reverbPercent: 70, peakDbfs: -18, roomToneDbfs: -76, seed: 41 });

/** Host in the studio on the left; a caller through a 16 kHz codec on the right, after the host. */
function phoneIn(): TakeAudio {
  const host = voice(0, 48000, -5);
  const caller = narrowbandVoiceTake(3, 16000, 48000, -6, 221);
  const frames = host.length + caller.length;
  const left = mixInto(new Float64Array(frames), host);
  mixInto(left, roomTone(frames - host.length, 48000, -66, 222), 1, host.length);
  const right = mixInto(new Float64Array(frames), roomTone(host.length, 48000, -84, 223));
  mixInto(right, caller, 1, host.length);
  return take([left, right], 48000, 'pcm24');
}

/** A drama mix in 5.1 (mask with side surrounds, 0x60F): dialogue in C, a music bed in L/R, ambience in Ls/Rs at `atmosDbfs` RMS, LFE from the bed. */
function dramaSurround(atmosDbfs = -46): TakeAudio {
  const dialogue = voiceForMix(3, 48000, -6, 231);
  const seconds = dialogue.length / 48000;
  const [l, r] = pieceTake({ seconds, sampleRate: 48000, channels: 2, peakDbfs: -16, seed: 232, instrument: 'sine', beatSec: 1.2, reverbPercent: 80, roomToneDbfs: -80 });
  const c = mixInto(dialogue.slice(), roomTone(dialogue.length, 48000, -72, 233));
  const [ls, rs] = noiseTake(seconds, 48000, 2, atmosDbfs, 234);
  const lfe = l.map((x, i) => 0.5 * (x + r[i]));
  const pole = Math.exp((-2 * Math.PI * 120) / 48000);
  for (let i = 1; i < lfe.length; i++) lfe[i] = pole * lfe[i - 1] + (1 - pole) * lfe[i];
  return { channels: [l, r, c, lfe, ls, rs], sampleRate: 48000, coding: 'float32', extensibleMask: 0x60f };
}

/** A field recorder's stereo mode: a spaced pair on a conversation, its two tracks named MixL and MixR in iXML. */
function recorderStereo(): TakeAudio {
  return { ...take(twoMicTake(7, 0, 48000, -6, -8, 0.0015, 271), 48000, 'pcm24'), trackNames: ['MixL', 'MixR'] };
}

/** Location poly: mix L/R, boom, plant mic, three lavaliers (the third on a silent actor, hearing the others), a spare at digital zero. */
function locationPoly(): TakeAudio {
  const [lavA, lavB] = twoMicTake(5, 6, 48000, -8, -24, 0.003, 241);
  const frames = lavA.length;
  const boom = mixInto(mixInto(roomTone(frames, 48000, -60, 242), lavA, 0.5, 96), lavB, 0.45, 120);
  const plant = mixInto(mixInto(roomTone(frames, 48000, -58, 243), lavA, 0.25, 290), lavB, 0.3, 190);
  const lavC = mixInto(mixInto(roomTone(frames, 48000, -64, 244), lavA, 0.08, 150), lavB, 0.07, 170);
  const mixL = lavA.map((x, i) => 0.7 * x + 0.4 * lavB[i] + 0.2 * boom[i]);
  const mixR = lavA.map((x, i) => 0.4 * x + 0.7 * lavB[i] + 0.2 * boom[i]);
  const channels = [mixL, mixR, boom, plant, lavA, lavB, lavC, new Float64Array(frames)];
  return { channels, sampleRate: 48000, coding: 'pcm24', trackNames: ['Mix L', 'Mix R', 'Boom', 'Plant', 'Lav Greta', 'Lav Henri', 'Lav Kai', 'Spare'] };
}

export const VARIETY_CLEAN_TAKES: EvalTake[] = [
  { id: 'voice-en-m3-fast-48k-24', description: 'speech, en+m3 at 205 wpm, pitch 35, peak -4 dBFS, 48 kHz 24-bit mono', slice: false, make: () => mono(voice(0, 48000, -4), 48000, 'pcm24') },
  { id: 'voice-en-f2-slow-96k-float', description: 'speech, en+f2 at 125 wpm, pitch 75, peak -2 dBFS, small room, 96 kHz float mono', slice: false, make: () => mono(voice(1, 96000, -2, { roomPercent: 10, roomToneDbfs: -70 }), 96000, 'float32') },
  { id: 'voice-de-m4-flat-mic-48k-24', description: 'speech, de+m4, pitch 25, no low cut (asymmetric waveform), peak -3 dBFS, 48 kHz 24-bit mono', slice: false, make: () => mono(voice(2, 48000, -3, { lowCutHz: 0, roomToneDbfs: -64 }), 48000, 'pcm24') },
  { id: 'voice-fr-f1-44k-16', description: 'speech, fr+f1 at 180 wpm, pitch 65, peak -8 dBFS, 44.1 kHz 16-bit mono', slice: false, make: () => take([voice(3, 44100, -8, { roomToneDbfs: -68 })], 44100, 'pcm16') },
  { id: 'voice-es-m2-booth-96k-24', description: 'speech, es+m2 at 220 wpm, dead booth, peak -1 dBFS, 96 kHz 24-bit mono', slice: false, make: () => mono(voice(4, 96000, -1, { roomPercent: 0, roomToneDbfs: -74 }), 96000, 'pcm24') },
  { id: 'voice-de-f5-quiet-flat-mic-44k-16', description: 'speech, de+f5, no low cut, quiet: peak -22 dBFS, room tone -80 dBFS, 44.1 kHz 16-bit mono', slice: false, make: () => take([voice(5, 44100, -22, { lowCutHz: 0, roomToneDbfs: -80 })], 44100, 'pcm16') },
  { id: 'voice-fr-m1-deep-flat-booth-96k-float', description: 'speech, fr+m1 at 120 wpm, pitch 20, no low cut, dead booth, peak -1 dBFS, 96 kHz float mono', slice: true, make: () => mono(voice(6, 96000, -1, { lowCutHz: 0, roomPercent: 0, roomToneDbfs: -72 }), 96000, 'float32') },
  { id: 'voice-es-f3-high-48k-float', description: 'speech, es+f3, pitch 80, peak -6 dBFS, 48 kHz float mono', slice: false, make: () => mono(voice(7, 48000, -6), 48000, 'float32') },
  { id: 'phone-in-48k-24', description: 'host on the left, a caller through a 16 kHz codec on the right after the host, 48 kHz 24-bit stereo', slice: false, make: phoneIn },
  { id: 'conversation-de-fr-48k-24', description: 'two-mic conversation (de+m4, fr+f1), bleed -18 dB at 3 ms, 48 kHz 24-bit stereo', slice: true, make: () => take(twoMicTake(2, 3, 48000, -4, -18, 0.003, 211), 48000, 'pcm24') },
  { id: 'conversation-es-en-44k-16', description: 'two-mic conversation (es+m2, en+f2), bleed -12 dB at 2 ms, 44.1 kHz 16-bit stereo', slice: false, make: () => take(twoMicTake(4, 1, 44100, -6, -12, 0.002, 212), 44100, 'pcm16') },
  { id: 'conversation-fr-de-96k-float', description: 'two-mic conversation (fr+m1, de+f5), bleed -24 dB at 5 ms, 96 kHz float stereo', slice: false, make: () => take(twoMicTake(6, 5, 96000, -2, -24, 0.005, 213), 96000, 'float32') },
  { id: 'piece-pluck-bus-48k-24', description: 'plucked chords and bass through reverb and a bus compand, peak -3 dBFS, 48 kHz 24-bit stereo', slice: false, make: () => take(piece({ sampleRate: 48000, instrument: 'pluck', compand: BUS_COMPAND }), 48000, 'pcm24') },
  { id: 'piece-sine-pad-44k-16', description: 'sine-wave chords (a pad) through a long reverb and a bus compand, peak -2 dBFS, 44.1 kHz 16-bit stereo', slice: false, make: () => take(piece({ sampleRate: 44100, instrument: 'sine', beatSec: 1.5, reverbPercent: 85, peakDbfs: -2, compand: BUS_COMPAND, seed: 32 }), 44100, 'pcm16') },
  { id: 'piece-square-drums-96k-float', description: 'square-wave synth chords through a low-pass, kick and hi-hat, reverb, bus compand, peak -1 dBFS, 96 kHz float stereo', slice: false, make: () => take(piece({ sampleRate: 96000, instrument: 'square', drums: true, peakDbfs: -1, compand: BUS_COMPAND, seed: 33, seconds: 10 }), 96000, 'float32') },
  { id: 'master-limited-48k-24', description: 'loud limited master (square synth, drums, look-ahead compand at a ceiling), peak -1 dBFS, 48 kHz 24-bit stereo', slice: false, make: () => take(limitedMaster(16, 48000, -1, 51), 48000, 'pcm24') },
  { id: 'master-limited-44k-16', description: 'loud limited master, peak -1 dBFS, 44.1 kHz 16-bit stereo', slice: false, make: () => take(limitedMaster(12, 44100, -1, 52), 44100, 'pcm16') },
  { id: 'master-widened-48k-24', description: 'limited master through a stereo widener (side +6 dB: panned parts in anti-phase on the far side), peak -1 dBFS, 48 kHz 24-bit', slice: true, make: () => take(widen(limitedMaster(12, 48000, -1, 53), 2, -1), 48000, 'pcm24') },
  { id: 'square-sting-48k-24', description: 'chiptune-style sting: band-limited square-wave notes at -6 to -8 dBFS, 48 kHz 24-bit mono', slice: false, make: () => mono(squareMelody(40, 48000, 61), 48000, 'pcm24') },
  { id: 'spaced-pair-ensemble-48k-24', description: 'spaced pair on a small ensemble: bass 2 ms early on the left, chords 3 ms and hi-hat 4 ms early on the right, peak -3 dBFS, 48 kHz 24-bit', slice: false, make: () => take(spacedPairTake(16, 48000, -3, 281), 48000, 'pcm24') },
  { id: 'acoustic-quiet-96k-24', description: 'quiet acoustic-like piece (plucked strings, live room), peak -18 dBFS, 96 kHz 24-bit stereo', slice: false, make: () => take(acoustic(96000), 96000, 'pcm24') },
  { id: 'acoustic-quiet-mono-44k-16', description: 'quiet acoustic-like piece, mono, peak -18 dBFS, 44.1 kHz 16-bit', slice: false, make: () => take(piece({ sampleRate: 44100, channels: 1, instrument: 'pluck', beatSec: 0.9, reverbPercent: 70, peakDbfs: -18, roomToneDbfs: -78, seed: 42 }), 44100, 'pcm16') },
  { id: 'room-tone-96k-float', description: 'room tone only, -68 dBFS RMS, 96 kHz float mono', slice: false, make: () => mono(roomTone(96000 * 10, 96000, -68, 251), 96000, 'float32') },
  { id: 'room-tone-44k-16', description: 'room tone only, -74 dBFS RMS, 44.1 kHz 16-bit stereo (two independent microphones)', slice: false, make: () => take([roomTone(441000, 44100, -74, 252), roomTone(441000, 44100, -73, 253)], 44100, 'pcm16') },
  { id: 'surround-drama-5.1-48k-float', description: 'drama mix: dialogue in C, music bed L/R, ambience Ls/Rs, LFE from the bed, mask 0x60F, 48 kHz float', slice: false, make: dramaSurround },
  { id: 'surround-drama-quiet-atmos-48k-float', description: 'drama 5.1 whose surrounds carry only a quiet atmosphere at -58 dBFS RMS (40 dB under the dialogue)', slice: true, make: () => dramaSurround(-58) },
  { id: 'recorder-stereo-ixml-48k-24', description: 'field recorder stereo: a spaced pair (bleed -8 dB at 1.5 ms), tracks named MixL/MixR in iXML, 48 kHz 24-bit', slice: false, make: recorderStereo },
  { id: 'location-poly-8-48k-24', description: 'location poly: mix L/R, boom, plant, three lavaliers (one on a silent actor), a spare at zero, iXML names, 48 kHz 24-bit', slice: false, make: locationPoly },
];

export const VARIETY_FAULT_TAKES: EvalTake[] = [
  { id: 'narrowband-16k-es-48k', row: 'low bandwidth / upsampled', description: 'es+m2 speech through a 16 kHz codec, converted up to 48 kHz, studio converter noise', slice: false, expect: { checks: ['sample-rate', 'bandwidth'] },
    make: () => mono(narrowbandVoiceTake(4, 16000, 48000, -4, 261), 48000, 'pcm24') },
  { id: 'narrowband-8k-de-44k-16', row: 'low bandwidth / upsampled', description: 'de+m4 speech through an 8 kHz phone line, converted up to 44.1 kHz, 16-bit', slice: false, expect: { checks: ['sample-rate', 'bandwidth'] },
    make: () => take([narrowbandVoiceTake(2, 8000, 44100, -3, 262)], 44100, 'pcm16') },
  { id: 'clip-below-20-de-flat-mic-44k-24', row: 'clipping below full scale', description: 'flat tops at -20 dBFS (driven 6 dB past), no low cut, converter noise -105 dBFS, 3-5 s', slice: false, expect: { checks: ['clipping'], channel: 0, fromSec: 3, toSec: 5 },
    make: () => mono(fault.clipBeforeConverter(voice(2, 44100, -10, { lowCutHz: 0 }), 44100, 3, 5, -20, 6, -105, 301), 44100, 'pcm24') },
  { id: 'clip-below-15-es-converter-96k-float', row: 'clipping below full scale', description: 'analogue clip through a 96 kHz converter\'s filter at -15 dBFS, driven 5 dB past, noise -100 dBFS, float, 2-4 s', slice: false, expect: { checks: ['clipping'], channel: 0, fromSec: 2, toSec: 4 },
    make: () => mono(fault.clipBeforeConverter(voice(4, 96000, -10), 96000, 2, 4, -15, 5, -100, 302, true), 96000, 'float32') },
  { id: 'clip-below-20-es-fast-converter-48k', row: 'clipping below full scale', description: 'analogue clip through a 48 kHz converter\'s filter at -20 dBFS (driven 6 dB past), fast high-formant voice, noise -100 dBFS, 3-5 s', slice: true, expect: { checks: ['clipping'], channel: 0, fromSec: 3, toSec: 5 },
    make: () => mono(fault.clipBeforeConverter(voice(4, 48000, -10), 48000, 3, 5, -20, 6, -100, 306, true), 48000, 'pcm24') },
  { id: 'clip-below-12-fr-slight-44k-16', row: 'clipping below full scale', description: 'flat tops at -12 dBFS driven only 3 dB past, 16-bit, 4-6 s', slice: false, expect: { checks: ['clipping'], channel: 0, fromSec: 4, toSec: 6 },
    make: () => take([fault.clipBeforeConverter(voice(3, 44100, -10), 44100, 4, 6, -12, 3, -100, 303)], 44100, 'pcm16') },
  { id: 'clip-below-6-piece-right', row: 'clipping below full scale', description: 'plucked piece, right channel clipped at -6 dBFS (driven 5 dB past) through the converter\'s filter, 4-6 s', slice: false, expect: { checks: ['clipping'], channel: 1, fromSec: 4, toSec: 6 },
    make: () => { const channels = piece({ sampleRate: 48000, instrument: 'pluck', compand: BUS_COMPAND }); fault.clipBeforeConverter(channels[1], 48000, 4, 6, -6, 5, -110, 304, true); return take(channels, 48000, 'pcm24'); } },
  { id: 'clip-below-1-master-left', row: 'clipping below full scale', description: 'limited master, left channel clipped at -1 dBFS (driven 4 dB past), noise -110 dBFS, 6-8 s', slice: false, expect: { checks: ['clipping'], channel: 0, fromSec: 6, toSec: 8 },
    make: () => { const channels = limitedMaster(16, 48000, -1, 51); fault.clipBeforeConverter(channels[0], 48000, 6, 8, -1, 4, -110, 305); return take(channels, 48000, 'pcm24'); } },
  { id: 'clip-full-fr-deep-44k-16', row: 'clipping at full scale', description: 'deep voice driven 4 dB past full scale, 2-4 s, 16-bit', slice: false, expect: { checks: ['clipping'], channel: 0, fromSec: 2, toSec: 4 },
    make: () => take([fault.overload(voice(6, 44100, -6), 44100, 2, 4, 4)], 44100, 'pcm16') },
  { id: 'clip-full-master-2db', row: 'clipping at full scale', description: 'limited master driven 2 dB past full scale, 5-6 s, both channels', slice: false, expect: { checks: ['clipping'], fromSec: 5, toSec: 6 },
    make: () => { const channels = limitedMaster(16, 48000, -1, 51); for (const channel of channels) fault.overload(channel, 48000, 5, 6, 2); return take(channels, 48000, 'pcm24'); } },
  { id: 'polarity-conversation-de-fr-right', row: 'polarity inversion', description: 'two-mic conversation (bleed -18 dB at 3 ms), right microphone polarity-inverted', slice: true, expect: { checks: ['stereo'] },
    make: () => { const channels = twoMicTake(2, 3, 48000, -4, -18, 0.003, 211); fault.invert(channels[1]); return take(channels, 48000, 'pcm24'); } },
  { id: 'polarity-piece-square-left', row: 'polarity inversion', description: 'square synth piece with drums, left channel polarity-inverted, 96 kHz float', slice: false, expect: { checks: ['stereo'] },
    make: () => { const channels = piece({ sampleRate: 96000, instrument: 'square', drums: true, peakDbfs: -1, compand: BUS_COMPAND, seed: 33, seconds: 10 }); fault.invert(channels[0]); return take(channels, 96000, 'float32'); } },
  { id: 'polarity-master-right', row: 'polarity inversion', description: 'limited master, right channel polarity-inverted, 44.1 kHz 16-bit', slice: false, expect: { checks: ['stereo'] },
    make: () => { const channels = limitedMaster(12, 44100, -1, 52); fault.invert(channels[1]); return take(channels, 44100, 'pcm16'); } },
  { id: 'polarity-master-widened-right', row: 'polarity inversion', description: 'widened limited master (side +6 dB), right channel polarity-inverted', slice: false, expect: { checks: ['stereo'] },
    make: () => { const channels = widen(limitedMaster(12, 48000, -1, 53), 2, -1); fault.invert(channels[1]); return take(channels, 48000, 'pcm24'); } },
  { id: 'polarity-spaced-pair-right', row: 'polarity inversion', description: 'spaced pair on a small ensemble, right microphone polarity-inverted', slice: false, expect: { checks: ['stereo'] },
    make: () => { const channels = spacedPairTake(16, 48000, -3, 281); fault.invert(channels[1]); return take(channels, 48000, 'pcm24'); } },
  { id: 'dc-0.2pc-es-44k-16', row: 'DC offset', description: 'steady DC of 0.2 % of full scale in fast Spanish speech, 44.1 kHz 16-bit', slice: true, expect: { checks: ['dc-offset'], channel: 0 },
    make: () => take([fault.dcOffset(voice(4, 44100, -6), 0.002)], 44100, 'pcm16') },
  { id: 'dc-0.2pc-de-flat-mic', row: 'DC offset', description: 'steady DC of 0.2 % in speech from a flat microphone (no low cut), 48 kHz 24-bit', slice: false, expect: { checks: ['dc-offset'], channel: 0 },
    make: () => mono(fault.dcOffset(voice(2, 48000, -3, { lowCutHz: 0, roomToneDbfs: -64 }), 0.002), 48000, 'pcm24') },
  { id: 'dc-0.2pc-acoustic-left', row: 'DC offset', description: 'steady DC of 0.2 % on the left channel of the quiet acoustic piece, 96 kHz 24-bit', slice: false, expect: { checks: ['dc-offset'], channel: 0 },
    make: () => { const channels = acoustic(96000); fault.dcOffset(channels[0], 0.002); return take(channels, 96000, 'pcm24'); } },
  { id: 'dead-zero-piece-left', row: 'dead channel (digital zero)', description: 'sine pad piece, left channel digital zero, 44.1 kHz 16-bit', slice: false, expect: { checks: ['silent-channel'], channel: 0 },
    make: () => { const channels = piece({ sampleRate: 44100, instrument: 'sine', beatSec: 1.5, reverbPercent: 85, peakDbfs: -2, compand: BUS_COMPAND, seed: 32 }); channels[0].fill(0); return take(channels, 44100, 'pcm16'); } },
  { id: 'dead-zero-surround-c', row: 'dead channel (digital zero)', description: 'drama 5.1 with the dialogue channel (C) at digital zero', slice: false, expect: { checks: ['silent-channel'], channel: 2 },
    make: () => { const audio = dramaSurround(); audio.channels[2].fill(0); return audio; } },
  { id: 'dead-zero-recorder-stereo-right', row: 'dead channel (digital zero)', description: 'field recorder stereo (iXML MixL/MixR) with the right track at digital zero', slice: true, expect: { checks: ['silent-channel'], channel: 1 },
    make: () => { const audio = recorderStereo(); audio.channels[1].fill(0); return audio; } },
  { id: 'polarity-recorder-stereo-right', row: 'polarity inversion', description: 'field recorder stereo (iXML MixL/MixR), right track polarity-inverted', slice: false, expect: { checks: ['stereo'] },
    make: () => { const audio = recorderStereo(); fault.invert(audio.channels[1]); return audio; } },
  { id: 'dead-hiss-60-surround-c', row: 'dead channel (open-input hiss)', description: 'drama 5.1 with the dialogue channel (C) only hiss at -60 dBFS RMS (an open input at high gain)', slice: false, expect: { checks: ['silent-channel'], channel: 2 },
    make: () => { const audio = dramaSurround(); audio.channels[2] = fault.openInputHiss(audio.channels[2].length, -60, 313); return audio; } },
  { id: 'dead-hiss-90-conversation-right', row: 'dead channel (open-input hiss)', description: 'two-mic conversation, right microphone only an open input\'s hiss at -90 dBFS RMS, 44.1 kHz 16-bit', slice: false, expect: { checks: ['silent-channel'], channel: 1 },
    make: () => { const channels = twoMicTake(4, 1, 44100, -6, -12, 0.002, 212); channels[1] = fault.openInputHiss(channels[1].length, -90, 311); return take(channels, 44100, 'pcm16'); } },
  { id: 'dead-hiss-90-surround-rs', row: 'dead channel (open-input hiss)', description: 'drama 5.1 with Rs only hiss at -90 dBFS RMS', slice: false, expect: { checks: ['silent-channel'], channel: 5 },
    make: () => { const audio = dramaSurround(); audio.channels[5] = fault.openInputHiss(audio.channels[5].length, -90, 312); return audio; } },
  { id: 'dropout-5ms-en-f2-96k-float', row: 'dropout', description: '5 ms of digital silence at 6.0 s in slow speech, 96 kHz float', slice: true, expect: { checks: ['dropout'], fromSec: 6, toSec: 6.005 },
    make: () => mono(fault.dropout([voice(1, 96000, -2, { roomPercent: 10, roomToneDbfs: -70 })], 96000, 6, 0.005)[0], 96000, 'float32') },
  { id: 'dropout-5ms-acoustic-quiet-mono-44k-16', row: 'dropout', description: '5 ms of digital silence at 3.0 s in the quiet acoustic piece, 44.1 kHz 16-bit', slice: false, expect: { checks: ['dropout'], fromSec: 3, toSec: 3.005 },
    make: () => take(fault.dropout(piece({ sampleRate: 44100, channels: 1, instrument: 'pluck', beatSec: 0.9, reverbPercent: 70, peakDbfs: -18, roomToneDbfs: -78, seed: 42 }), 44100, 3, 0.005), 44100, 'pcm16') },
  { id: 'dropout-5ms-master', row: 'dropout', description: '5 ms of digital silence at 7.3 s in the limited master', slice: false, expect: { checks: ['dropout'], fromSec: 7.3, toSec: 7.305 },
    make: () => take(fault.dropout(limitedMaster(16, 48000, -1, 51), 48000, 7.3, 0.005), 48000, 'pcm24') },
  { id: 'hum-50-de-speech', row: 'hum under speech', description: '50 Hz hum with harmonics, fundamental at -55 dBFS, under German speech, 48 kHz 24-bit', slice: false, expect: { checks: ['hum'] },
    make: () => mono(fault.hum(voice(2, 48000, -4), 48000, 50, -55), 48000, 'pcm24') },
  { id: 'hum-60-fr-flat-mic', row: 'hum under speech', description: '60 Hz hum, fundamental at -58 dBFS, under French speech from a flat microphone, 96 kHz 24-bit', slice: false, expect: { checks: ['hum'] },
    make: () => mono(fault.hum(voice(6, 96000, -3, { lowCutHz: 0 }), 96000, 60, -58), 96000, 'pcm24') },
];
