import { execFileSync } from 'node:child_process';
import { afterAll, describe, expect, it } from 'vitest';
import { analyzeConverterCheckFile } from '../../../dsp/converter/analyzeCheck';
import { ConverterCheckError } from '../../../dsp/converter/ConverterCheckError';
import { writeCheckSignalFile } from '../../../dsp/converter/signalWriter';
import { readWav, simulateRecording, type SimulatedConverter } from '../../support/converterSimulation';
import { tempDirectory } from '../../support/tempFiles';
import { concat, ProgrammeGenerator } from '../../support/testSignals';
import { encodeSamples, wavFile } from '../../support/wavWriter';

const temp = tempDirectory();
afterAll(() => temp.remove());

const RATE = 48000;

const clean: SimulatedConverter = {
  bits: 24, gainsDb: [0, 0], inverted: [false, false], lowPass: { cutoffHz: 20000, order: 6 }, noiseDbfs: -100, secondOrder: 0,
  crosstalk: [], delaySamples: [0, 0], clockPpm: 0, leadSec: 2, tailSec: 2, seed: 5,
};

let signalPath: string | null = null;
async function stereoSignal(): Promise<string> {
  if (!signalPath) {
    signalPath = temp.path('signal-48-24-2.wav');
    await writeCheckSignalFile(signalPath, { sampleRate: RATE, bitsPerSample: 24, channels: 2 });
  }
  return signalPath;
}

async function record(name: string, changes: Partial<SimulatedConverter>): Promise<string> {
  const path = temp.path(`${name}.wav`);
  await simulateRecording(await stereoSignal(), temp.path, { ...clean, ...changes }, path);
  return path;
}

const write = (name: string, channels: Float64Array[]) => temp.write(`${name}.wav`, wavFile({ sampleRate: RATE, channels: channels.length, coding: 'pcm24' }, encodeSamples(channels, 'pcm24')));

const programme = (seconds: number, seed: number) => {
  const out = [new Float64Array(Math.round(seconds * RATE)), new Float64Array(Math.round(seconds * RATE))];
  new ProgrammeGenerator(RATE, 2, seed).fill(out, out[0].length);
  return out;
};

async function refusal(path: string): Promise<ConverterCheckError> {
  const error = await analyzeConverterCheckFile(path).then(() => null, (e: unknown) => e);
  expect(error).toBeInstanceOf(ConverterCheckError);
  return error as ConverterCheckError;
}

describe('converter check: finding the signal, and refusing what is not one', () => {
  // A false alarm would turn a take into a "converter check": realistic material without the signal must be refused.
  it('finds no check signal in programme-like noise or in sox-synthesised plucked chords', async () => {
    const speechLike = write('programme', programme(30, 3));
    expect((await refusal(speechLike)).reason).toBe('no-signal');
    const music = temp.path('music.wav');
    execFileSync('sox', ['-n', '-r', String(RATE), '-b', '24', music, 'synth', '2', 'pluck', 'A3', 'pluck', 'C4', 'pluck', 'E4', 'remix', '1-3', '1-3', 'repeat', '9', 'reverb', '40', 'gain', '-6']);
    expect((await refusal(music)).reason).toBe('no-signal');
  });

  it('finds the signal between stretches of programme and measures it as if alone', async () => {
    const { channels } = await readWav(await record('between-programme', { noiseDbfs: -105, leadSec: 0, tailSec: 0 }));
    const before = programme(6, 8);
    const after = programme(4, 9);
    const path = write('between-programme-mixed', channels.map((x, c) => concat(before[c], x, after[c])));
    const report = await analyzeConverterCheckFile(path);
    expect(report.signal.startSec).toBeGreaterThan(6);
    for (const channel of report.channels) expect(Math.abs(channel.gainDb!)).toBeLessThanOrEqual(0.1);
    expect(Math.abs(report.clockErrorPpm!)).toBeLessThanOrEqual(2);
  });

  it('says when the recording stops before the end of the signal', async () => {
    const { channels } = await readWav(await record('cut-short', {}));
    const cut = channels.map((x) => x.slice(0, Math.round(20 * RATE)));
    const error = await refusal(write('cut-short-cut', cut));
    expect(error.reason).toBe('incomplete-signal');
    expect(error.message).toMatch(/end was not found/);
  });

  it('says when the recording starts after the signal did', async () => {
    const { channels } = await readWav(await record('started-late', {}));
    const late = channels.map((x) => x.slice(Math.round(6 * RATE)));
    const error = await refusal(write('started-late-cut', late));
    expect(error.reason).toBe('incomplete-signal');
    expect(error.message).toMatch(/not its start/);
  });

  it('names both channel counts when a stereo signal is recorded into four channels', async () => {
    const { channels } = await readWav(await record('four-inputs', {}));
    const error = await refusal(write('four-inputs-wide', [...channels, new Float64Array(channels[0].length), Float64Array.from(channels[1])]));
    expect(error.reason).toBe('channel-count');
    expect(error.message).toMatch(/written for 2 channels but the recording has 4/);
  });

  it.each([-800, 650])('still measures a clock error of %i ppm', async (ppm) => {
    const report = await analyzeConverterCheckFile(await record(`clock-${ppm}`, { clockPpm: ppm }));
    expect(Math.abs(report.clockErrorPpm! - ppm)).toBeLessThanOrEqual(2);
    expect(report.findings.find((finding) => finding.check === 'clock')?.message).toMatch(new RegExp(`${Math.abs(ppm)}\\.\\d ppm ${ppm > 0 ? 'slow' : 'fast'}`));
  });

  it('reports a dead channel instead of measuring its noise as a converter', async () => {
    const report = await analyzeConverterCheckFile(await record('dead-right', { gainsDb: [0, -150] }));
    expect(report.channels[1]).toMatchObject({ dead: true, gainDb: null, enobBits: null });
    expect(report.channels[0].dead).toBe(false);
    expect(report.crosstalkDb).toBeNull();
    expect(report.findings).toContainEqual(expect.objectContaining({ check: 'dead-channel', severity: 'fail', channel: 1 }));
  });

  it('tells the engineer to play the signal quieter when it clipped', async () => {
    const report = await analyzeConverterCheckFile(await record('too-loud', { gainsDb: [2, 2] }));
    expect(report.channels[0].clippedSamples).toBeGreaterThan(0);
    // The −20 dB FS tone still tells the gain the clipped −1 dB FS tone cannot.
    for (const channel of report.channels) expect(Math.abs(channel.gainDb! - 2)).toBeLessThanOrEqual(0.1);
    expect(report.findings).toContainEqual(expect.objectContaining({ check: 'overload', severity: 'fail', message: expect.stringMatching(/lower the playback level/) }));
  });

  it('measures a 48 kHz signal recorded at 44.1 kHz against the grid it was written with', async () => {
    const resampled = temp.path('played-48-recorded-44.wav');
    execFileSync('sox', [await stereoSignal(), '-r', '44100', resampled]);
    const report = await analyzeConverterCheckFile(resampled);
    expect(report.signal).toMatchObject({ writtenSampleRate: 48000, writtenBits: 24 });
    expect(report.file.sampleRate).toBe(44100);
    expect(Math.abs(report.clockErrorPpm!)).toBeLessThanOrEqual(2);
    const response = report.channels[0].frequencyResponse!;
    expect(response.hz.at(-1)!).toBeLessThanOrEqual(0.495 * 44100);
    expect(report.channels[0].passbandDeviationDb!).toBeLessThanOrEqual(0.1);
    expect(report.findings).toContainEqual(expect.objectContaining({ check: 'signal', severity: 'info', message: expect.stringMatching(/written at 48 kHz and recorded at 44.1 kHz; the response is measured up to 21.83 kHz/) }));
  });
});
