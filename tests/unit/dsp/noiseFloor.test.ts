import { describe, expect, it } from 'vitest';
import { NoiseFloorAnalyzer } from '@/dsp/analyzers/noiseFloor';
import {
  addInto, generateWithTool, mainsHum, musicLike, pcmFormat, pinkNoise, pushInBlocks, quantise, rmsDbfs, seededRandom, sine, speechLike, whiteNoise,
} from '@/tests/support/spectralSignals';
import { clipBeforeConverter } from '@/scripts/eval/faults';
import { voiceTake } from '@/scripts/eval/varietyMaterial';

const FS = 48000;

function analyse(channels: Float64Array[], sampleRate = FS, options = {}) {
  return pushInBlocks(new NoiseFloorAnalyzer(pcmFormat(sampleRate, channels.length), options), channels, [65536, 777, 4096]);
}

describe('NoiseFloorAnalyzer: floor level', () => {
  it('reads steady white noise at its RMS level (square-wave reference)', () => {
    // RMS dBFS = 20·log10(rms) for full scale 1.0 (the report contract's convention; Reiss & McPherson, Audio Effects, ch. 1 [from memory]).
    const r = analyse([whiteNoise(FS * 6, 10 ** (-70 / 20), 1)]);
    expect(r.floorDbfs!).toBeCloseTo(-70, 0);
    expect(Math.abs(r.floorDbfs! + 70)).toBeLessThan(0.3);
  });

  it('reads a steady quiet sine of amplitude 0.005 at −49.03 dBFS RMS (full-scale sine = −3.01 dBFS, square-wave reference)', () => {
    const r = analyse([sine(FS * 3, FS, 997, 0.005)]);
    expect(Math.abs(r.floorDbfs! - (20 * Math.log10(0.005) - 3.0103))).toBeLessThan(0.1);
    expect(r.basis).toBe('steady-noise');
  });

  // Issue seen in use: pink room tone read about 1-3 dB low (a percentile of short windows scatters low).
  // The level as generated is the whole signal's RMS (definition of RMS); tolerance 0.5 dB [common practice].
  it.each([
    ['white (Gaussian)', (level: number) => whiteNoise(FS * 10, 10 ** (level / 20), 31)],
    ["pink (Kellet's filter)", (level: number) => pinkNoise(FS * 10, 10 ** (level / 20), 32)],
  ])('reads steady %s room tone at its RMS level as generated, within 0.5 dB', (_, make) => {
    for (const level of [-72, -63, -50]) {
      const x = make(level);
      const r = analyse([x]);
      expect(Math.abs(r.floorDbfs! - rmsDbfs(x))).toBeLessThan(0.5);
      expect(r.basis).toBe('steady-noise');
    }
  });

  it("reads sox's pink noise (a Debian reference tool) at its RMS level within 0.5 dB", () => {
    const fx = generateWithTool('sox', (out) => ['-n', '-r', '48000', '-b', '24', out, 'synth', '10', 'pinknoise', 'vol', '0.001']);
    const r = analyse(fx.channels);
    expect(Math.abs(r.floorDbfs! - rmsDbfs(fx.channels[0]))).toBeLessThan(0.5);
  });

  it('claims no floor and no hum on dense material or a steady loud sound (no quiet passage), but does under pauses', () => {
    // Music-like chords over a bed, never quiet: the quietest windows are programme, not noise.
    const dense = addInto(musicLike(FS * 6, FS, 0.5, 33), mainsHum(FS * 6, FS, 50, -60));
    expect(analyse([dense])).toMatchObject({ floorDbfs: null, humHz: null, basis: 'none', noiseLimitedBits: null });
    // A steady ambience at -30 dBFS RMS and a -9 dBFS tone are programme too.
    expect(analyse([pinkNoise(FS * 8, 10 ** (-30 / 20), 34)]).floorDbfs).toBeNull();
    expect(analyse([sine(FS * 3, FS, 997, 0.5)]).floorDbfs).toBeNull();
    // The same music with real pauses over a -62 dBFS room tone: the floor is found.
    const withPauses = musicLike(FS * 8, FS, 0.5, 35);
    for (let i = 0; i < withPauses.length; i++) if (Math.floor(i / FS) % 2 === 1) withPauses[i] = 0;
    const r = analyse([addInto(withPauses, pinkNoise(FS * 8, 10 ** (-62 / 20), 36))]);
    expect(r.basis).toBe('quiet-passages');
    expect(Math.abs(r.floorDbfs! + 62)).toBeLessThan(0.5);
  });

  // Seen on clean music with one planted overload: the 95th-percentile window was the overload, so the music's
  // own quietest windows were read as a floor of about -20 dBFS with a ratio of 7-18 dB (and "hum" from its
  // notes). Loud windows in one stretch over dense material make no quiet passage [common practice].
  /** A dense mix: a pink bed whose level swings ±4 dB over 1.3 s, with chords under it; never quiet. */
  const denseMix = (seconds: number, seed: number) => {
    const x = pinkNoise(FS * seconds, 0.1, seed);
    for (let i = 0; i < x.length; i++) x[i] *= 10 ** ((4 * Math.sin((2 * Math.PI * i) / (1.3 * FS))) / 20);
    return addInto(x, musicLike(FS * seconds, FS, 0.1, seed + 1));
  };

  it('claims no floor, ratio or hum on a dense mix with one overloaded second or a louder, clipped stretch', () => {
    const overloaded = denseMix(10, 37);
    for (let i = 4 * FS; i < 5 * FS; i++) overloaded[i] = Math.max(-1, Math.min(1, overloaded[i] * 8));
    expect(analyse([overloaded])).toMatchObject({ floorDbfs: null, snrDb: null, humHz: null, basis: 'none' });
    // Driven 10 dB into a clip at -6 dBFS for two seconds, the rest lowered 4 dB (an analogue stage clipping before the converter).
    const drivenStretch = denseMix(14, 38);
    for (let i = 0; i < drivenStretch.length; i++) {
      drivenStretch[i] = i >= 6 * FS && i < 8 * FS ? Math.max(-0.5, Math.min(0.5, drivenStretch[i] * 3)) : drivenStretch[i] * 0.6;
    }
    expect(analyse([drivenStretch, denseMix(14, 40)])).toMatchObject({ floorDbfs: null, snrDb: null, humHz: null, basis: 'none' });
  });

  it('measures room tone after a short slate as quiet passages, at its RMS level within 0.5 dB', () => {
    // Two seconds of speech-like slate, then 18 s of pink room tone: the programme fills a tenth of the take.
    const room = pinkNoise(FS * 20, 10 ** (-70 / 20), 47);
    const take = new Float64Array(room.length);
    take.set(speechLike(FS * 2, FS, 0.5, 48));
    addInto(take, room);
    const r = analyse([take]);
    expect(r.basis).toBe('quiet-passages');
    expect(Math.abs(r.floorDbfs! - rmsDbfs(room))).toBeLessThan(0.5);
  });

  it('finds the room noise under speech-like content with pauses', () => {
    const x = addInto(speechLike(FS * 12, FS, 0.5, 2), whiteNoise(FS * 12, 10 ** (-72 / 20), 3));
    const r = analyse([x]);
    expect(Math.abs(r.floorDbfs! + 72)).toBeLessThan(1);
  });

  it('leaves digital silence out of the floor, and returns null for a silent take', () => {
    const x = new Float64Array(FS * 8);
    x.set(whiteNoise(FS * 3, 10 ** (-80 / 20), 4), FS * 5);
    expect(Math.abs(analyse([x]).floorDbfs! + 80)).toBeLessThan(0.5);
    const silent = analyse([new Float64Array(FS * 4)]);
    expect(silent.floorDbfs).toBeNull();
    expect(silent.humHz).toBeNull();
    expect(silent.noiseLimitedBits).toBeNull();
  });

  it('does not count a DC offset as noise', () => {
    const x = whiteNoise(FS * 4, 10 ** (-75 / 20), 5);
    for (let i = 0; i < x.length; i++) x[i] += 0.01; // −40 dBFS of DC
    expect(Math.abs(analyse([x]).floorDbfs! + 75)).toBeLessThan(0.3);
  });

  it('reports the noisiest channel', () => {
    const r = analyse([whiteNoise(FS * 4, 10 ** (-90 / 20), 6), whiteNoise(FS * 4, 10 ** (-66 / 20), 7)]);
    expect(Math.abs(r.floorDbfs! + 66)).toBeLessThan(0.3);
  });

  // Seen on a clean 5.1 drama mix: the surrounds' steady atmosphere (-46 dBFS) was reported as the take's floor.
  // A steady sound beside a programme is part of it, or a dead input, not the floor of its quiet passages [common practice].
  it('takes the floor from the channels with quiet passages, not from a steady atmosphere beside them', () => {
    const dialogue = addInto(speechLike(FS * 12, FS, 0.5, 50), pinkNoise(FS * 12, 10 ** (-72 / 20), 51));
    const atmosphere = pinkNoise(FS * 12, 10 ** (-46 / 20), 52);
    const r = analyse([dialogue, atmosphere, atmosphere.slice()]);
    expect(r.basis).toBe('quiet-passages');
    expect(Math.abs(r.floorDbfs! + 72)).toBeLessThan(1);
    // Beside dense music (no quiet passage anywhere) a steady channel makes no floor either.
    expect(analyse([musicLike(FS * 8, FS, 0.5, 53), pinkNoise(FS * 8, 10 ** (-58 / 20), 54)]).floorDbfs).toBeNull();
  });

  it('gives 15.2 noise-limited bits for TPDF-dithered 16-bit silence (TPDF floor Q²/4 → 16 − log2(√3) = 15.21)', () => {
    // Zero signal + 2 LSB p-p TPDF dither, quantised to 16 bits: total noise Q²/4 (Lipshitz, Wannamaker & Vanderkooy, JAES 1992 [from memory]).
    const r = analyse([quantise(new Float64Array(FS * 6), 16, 11)]);
    expect(Math.abs(r.noiseLimitedBits! - 15.21)).toBeLessThan(0.1);
  });

  it('gives 16.0 noise-limited bits for uniform noise of one 16-bit LSB step (Q²/12, textbook ideal quantiser, 6.02N + 1.76 dB)', () => {
    const rand = seededRandom(12);
    const q = 2 ** -15;
    const x = Float64Array.from({ length: FS * 6 }, () => (rand() - 0.5) * q);
    expect(Math.abs(analyse([x]).noiseLimitedBits! - 16)).toBeLessThan(0.1);
  });
});

describe('NoiseFloorAnalyzer: signal-to-noise ratio', () => {
  // SNR = programme power over noise power (the definition of the ratio); the programme windows are the
  // speech, the floor the pauses between phrases.
  it('reads speech whose noise sits 8 dB under it (a very quiet take) at about 8.6 dB, and a clean take far higher', () => {
    const speech = speechLike(FS * 20, FS, 10 ** (-50 / 20), 41);
    let power = 0;
    let active = 0;
    for (const x of speech) {
      if (x === 0) continue;
      power += x * x;
      active++;
    }
    const speechRms = Math.sqrt(power / active);
    const noisy = analyse([addInto(speech.slice(), whiteNoise(speech.length, speechRms * 10 ** (-8 / 20), 42))]);
    expect(noisy.basis).toBe('quiet-passages');
    // (S + N)/N with N 8 dB under S: 10·log10(10^0.8 + 1) = 8.64 dB; the loudest windows read a little higher.
    expect(noisy.snrDb!).toBeGreaterThan(7.5);
    expect(noisy.snrDb!).toBeLessThan(12);
    const clean = analyse([addInto(speech.slice(), whiteNoise(speech.length, speechRms * 10 ** (-45 / 20), 43))]);
    expect(clean.snrDb!).toBeGreaterThan(40);
  });

  it('gives no ratio without quiet passages under a programme (steady room tone alone)', () => {
    expect(analyse([pinkNoise(FS * 8, 10 ** (-70 / 20), 44)]).snrDb).toBeNull();
  });
});

describe('NoiseFloorAnalyzer: iso tracks (a poly take)', () => {
  // Iso tracks are raw microphones the mix is made from: the cleanest sets what the take can give, and
  // unrelated tracks share no programme level for a signal-to-noise ratio [common practice].
  const track = (roomDbfs: number, seed: number) => addInto(speechLike(FS * 12, FS, 0.3, seed), pinkNoise(FS * 12, 10 ** (roomDbfs / 20), seed + 1));

  it('judges iso tracks by the quietest track and gives no signal-to-noise ratio', () => {
    const tracks = [track(-68, 60), track(-58, 62), track(-64, 64)];
    const asProgramme = analyse(tracks);
    expect(Math.abs(asProgramme.floorDbfs! + 58)).toBeLessThan(1);
    expect(asProgramme.snrDb).not.toBeNull();
    const analyzer = new NoiseFloorAnalyzer(pcmFormat(FS, 3));
    analyzer.push({ channels: tracks, frames: tracks[0].length, startFrame: 0 });
    const asTracks = analyzer.finish({ isoTracks: true });
    expect(Math.abs(asTracks.floorDbfs! + 68)).toBeLessThan(1);
    expect(asTracks.snrDb).toBeNull();
  });
});

describe('NoiseFloorAnalyzer: mains hum', () => {
  const speechOverRoom = (seed: number) =>
    addInto(speechLike(FS * 12, FS, 0.5, seed), pinkNoise(FS * 12, 10 ** (-70 / 20), seed + 100));

  it('finds 50 Hz hum with harmonics at −50 dBFS under speech-like content', () => {
    const x = addInto(speechOverRoom(20), mainsHum(FS * 12, FS, 50, -50));
    const r = analyse([x, x.slice()]);
    expect(r.humHz).toBe(50);
  });

  it('finds 60 Hz hum', () => {
    expect(analyse([addInto(speechOverRoom(21), mainsHum(FS * 12, FS, 60, -50))]).humHz).toBe(60);
  });

  it('finds 50 Hz hum in a 44.1 kHz take, 60 Hz in a 96 kHz take', () => {
    const fs1 = 44100;
    const a = addInto(whiteNoise(fs1 * 8, 10 ** (-70 / 20), 22), mainsHum(fs1 * 8, fs1, 50, -60));
    expect(analyse([a], fs1).humHz).toBe(50);
    const fs2 = 96000;
    const b = addInto(whiteNoise(fs2 * 8, 10 ** (-70 / 20), 23), mainsHum(fs2 * 8, fs2, 60, -60));
    expect(analyse([b], fs2).humHz).toBe(60);
  });

  it('finds a weak hum that is only a little above the broadband floor when read line by line', () => {
    // −75 dBFS of hum in −65 dBFS of white noise: 10 dB below the noise in total, but each
    // line sits in a 1.2 Hz bin against noise spread over 24 kHz.
    const x = addInto(whiteNoise(FS * 10, 10 ** (-65 / 20), 24), mainsHum(FS * 10, FS, 50, -75));
    expect(analyse([x]).humHz).toBe(50);
  });

  // Seen on fast speech with one clipped stretch: no hum frame lay wholly in a pause, so the two quietest
  // frames, speech, were taken as the floor's spectrum, and a voice's harmonics fell on the 50 Hz series.
  // Speech from espeak-ng (a Debian tool); hum frames only at the floor [common practice].
  it('claims no hum from speech frames when the pauses are too short to hold a floor frame', () => {
    const voice = voiceTake(4, { sampleRate: FS, peakDbfs: -10, roomToneDbfs: -66, seed: 204 });
    const r = analyse([clipBeforeConverter(voice, FS, 3, 5, -20, 6, -100, 306)]);
    expect(r.basis).toBe('quiet-passages');
    expect(r.humHz).toBeNull();
  });

  it('reads clean noise and speech-like content without hum as null', () => {
    expect(analyse([whiteNoise(FS * 10, 0.001, 25)]).humHz).toBeNull();
    expect(analyse([pinkNoise(FS * 10, 0.001, 26)]).humHz).toBeNull();
    expect(analyse([speechOverRoom(27)]).humHz).toBeNull();
  });

  it('finds hum in a sox-made fixture (50 Hz + 100 Hz + 150 Hz sines mixed with noise)', () => {
    // Fixture from sox's synth (outside the project): pink noise plus three mains lines.
    const fx = generateWithTool('sox', (out) => [
      '-n', '-r', '48000', '-b', '24', out, 'synth', '6', 'pinknoise', 'sine', '50', 'sine', '100', 'sine', '150',
      'remix', '1v0.02,2v0.003,3v0.002,4v0.001',
    ]);
    expect(analyse(fx.channels).humHz).toBe(50);
  });
});

describe('NoiseFloorAnalyzer: sampling long takes', () => {
  it('gives the same floor and hum from evenly spread segments as from the whole take, length declared or not', () => {
    const seconds = 90;
    const x = addInto(addInto(speechLike(FS * seconds, FS, 0.5, 40), whiteNoise(FS * seconds, 10 ** (-72 / 20), 41)), mainsHum(FS * seconds, FS, 60, -80));
    const whole = analyse([x]);
    const run = (declared: boolean) =>
      pushInBlocks(new NoiseFloorAnalyzer(pcmFormat(FS, 1, 24, declared ? x.length : null), { maxSegments: 12 }), [x], 65536);
    for (const sampled of [run(true), run(false)]) {
      expect(Math.abs(sampled.floorDbfs! - whole.floorDbfs!)).toBeLessThan(1);
      expect(sampled.humHz).toBe(60);
    }
    expect(whole.humHz).toBe(60);
  });
});

describe('NoiseFloorAnalyzer: configuration', () => {
  it('rejects impossible configuration with a message', () => {
    expect(() => new NoiseFloorAnalyzer(pcmFormat(-48000, 2))).toThrow(/sample rate/);
    expect(() => new NoiseFloorAnalyzer(pcmFormat(48000, 1.5))).toThrow(/channel count/);
    expect(() => new NoiseFloorAnalyzer(pcmFormat(48000, 2), { floorPercentile: 0 })).toThrow(/floorPercentile/);
    expect(() => new NoiseFloorAnalyzer(pcmFormat(48000, 2), { humProminenceDb: Number.NaN })).toThrow(/humProminenceDb/);
    expect(() => new NoiseFloorAnalyzer(pcmFormat(48000, 2), { maxSegments: 2.5 })).toThrow(/maxSegments/);
  });
});
