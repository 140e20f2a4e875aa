import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { Readable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ClippingAnalyzer } from '../../../dsp/analyzers/clipping';
import { LoudnessAnalyzer } from '../../../dsp/analyzers/loudness';
import { TruePeakAnalyzer } from '../../../dsp/analyzers/truePeak';
import { WorkerAnalyzers } from '../../../dsp/parallel/WorkerAnalyzers';
import { PARALLEL_MIN_BYTES, PROGRESS_INTERVAL_MS, analyzeFile, analyzeStream } from '../../../dsp/pipeline';
import { UnreadableWavError } from '../../../dsp/reader/UnreadableWavError';
import type { AnalysisReport } from '../../../dsp/types';
import { formatOf } from '../../support/analyzerHarness';
import { ffmpegEbur128, soxStats } from '../../support/referenceTools';
import { tempDirectory } from '../../support/tempFiles';
import { ProgrammeGenerator, concat, seededRandom, sine } from '../../support/testSignals';
import { bufferStream } from '../../support/wavStreams';
import { encodeSamples, wavFile } from '../../support/wavWriter';

const RATE = 48000;
const temp = tempDirectory();
afterAll(() => temp.remove());

function programme(seconds: number, seed: number): Float64Array[] {
  const channels = [new Float64Array(seconds * RATE), new Float64Array(seconds * RATE)];
  new ProgrammeGenerator(RATE, 2, seed).fill(channels, seconds * RATE);
  return channels;
}

describe('cross-checks on 40 s of programme-like material against ffmpeg and sox', () => {
  let path: string;
  let report: AnalysisReport;
  beforeAll(async () => {
    path = temp.write('programme.wav', wavFile({ sampleRate: RATE, channels: 2, coding: 'pcm24' }, encodeSamples(programme(40, 5), 'pcm24')));
    report = await analyzeFile(path);
  });

  // ffmpeg's ebur128 filter is an independent BS.1770 / Tech 3342 implementation; it prints one decimal,
  // so ±0.1 LU is the Tech 3341 tolerance plus its rounding.
  it('integrated loudness within 0.15 LU, loudness range within 1 LU (Tech 3342 tolerance) of ffmpeg ebur128', () => {
    const reference = ffmpegEbur128(path);
    expect(Math.abs(report.loudness.integratedLufs! - reference.integratedLufs)).toBeLessThanOrEqual(0.15);
    expect(Math.abs(report.loudness.rangeLu! - reference.rangeLu)).toBeLessThanOrEqual(1);
    // True peak: EBU R 128 allows ±0.3 dB between true-peak meters (signals band-limited to 20 kHz); ffmpeg uses its own over-sampler.
    expect(Math.abs(report.peak.truePeakDbtp! - reference.truePeakDbfs)).toBeLessThanOrEqual(0.3);
  });

  // sox stats: "Pk lev dB" is the sample peak; "RMS lev dB" is 20·log10(rms), the same full-scale-square reference (a full-scale sine reads -3.01).
  it('sample peak, RMS and DC per channel match sox stats to its printed precision', () => {
    const stats = soxStats(path);
    for (let channel = 0; channel < 2; channel++) {
      expect(Math.abs(report.channels[channel].samplePeakDbfs! - Number(stats.get('Pk lev dB')![channel + 1]))).toBeLessThanOrEqual(0.006);
      expect(Math.abs(report.channels[channel].rmsDbfs! - Number(stats.get('RMS lev dB')![channel + 1]))).toBeLessThanOrEqual(0.006);
      expect(Math.abs(report.channels[channel].dcOffset - Number(stats.get('DC offset')![channel + 1]))).toBeLessThanOrEqual(0.0000006);
    }
  });

  it('fills every field of the report contract, with null where a measure does not apply', () => {
    const contractKeys = ['file', 'bext', 'channels', 'resolution', 'peak', 'clipping', 'loudness', 'noise', 'bandwidth', 'dropouts', 'stereo', 'tone', 'findings'];
    for (const key of contractKeys) expect(report).toHaveProperty(key);
    expect(Object.keys(report.file)).toEqual(expect.arrayContaining(['container', 'encoding', 'sampleRate', 'bitsPerSample', 'channels', 'frames', 'durationSec']));
    expect(report.file).toMatchObject({ container: 'RIFF', encoding: 'pcm', sampleRate: RATE, bitsPerSample: 24, channels: 2, frames: 40 * RATE, durationSec: 40 });
    expect(Object.keys(report.channels[0]).sort()).toEqual([
      'clippedSamples', 'dcOffset', 'effectiveBits', 'integratedLufs', 'name', 'nonFiniteSamples', 'overFullScaleSamples', 'rmsDbfs',
      'samplePeakDbfs', 'silent', 'silentKind', 'steadyDcOffset', 'truePeakAtSec', 'truePeakDbtp',
    ]);
    expect(report.file.layout).toBe('stereo');
    expect(report.channels.map((channel) => channel.name)).toEqual(['L', 'R']);
    expect(Object.keys(report.loudness)).toEqual(expect.arrayContaining(['integratedLufs', 'rangeLu', 'momentaryMaxLufs', 'shortTermMaxLufs']));
    expect(Object.keys(report.bandwidth)).toEqual(expect.arrayContaining(['effectiveHz', 'impliedSourceRate', 'nearNyquistDb', 'aliasingRisk', 'peakHz']));
    expect(Object.keys(report.noise).sort()).toEqual(['basis', 'floorDbfs', 'humHz', 'snrDb']);
    expect(report.resolution.effectiveBits).toBe(24);
    expect(report.bext).toBeNull();
    expect(report.stereo).not.toBeNull();
    expect(report.clipping.events).toEqual([]);
    expect(report.dropouts).toEqual([]);
    expect(report.loudness.shortTermSeries!.values).toHaveLength(40);
    expect(JSON.parse(JSON.stringify(report))).toEqual(report);
  });
});

describe('effective bits against sox', () => {
  // sox stats "Bit-depth a/b": a = bits from the highest to the lowest bit any sample uses (b is sox's own precision guess). For a take
  // peaking near full scale that equals container bits minus unused low bits, the figure Takeproof reports.
  it.each([
    [16, 'pcm24' as const],
    [20, 'pcm24' as const],
    [24, 'pcm24' as const],
  ])('a near-full-scale take quantised to %i bits in %s', async (bits, coding) => {
    const step = 2 ** (bits - 1);
    const signal = sine(997, 0.95, 2, RATE, 0.2).map((x) => Math.round(x * step) / step);
    const path = temp.write(`bits-${bits}.wav`, wavFile({ sampleRate: RATE, channels: 1, coding }, encodeSamples([signal], coding)));
    const report = await analyzeFile(path);
    expect(report.resolution.effectiveBits).toBe(bits);
    expect(soxStats(path).get('Bit-depth')![0].split('/')[0]).toBe(String(bits));
  });
});

describe('line-up tone and loudness (EBU R 128 measures the programme, not the line-up tone)', () => {
  it('leaves the tone out of integrated loudness, range, maxima and series, and says which stretch', async () => {
    // 3 s of 997 Hz at -9 dBFS (far louder than the programme), then 30 s of programme-like material.
    const programmeOnly = programme(30, 11);
    const tone = sine(997, 10 ** (-9 / 20), 3, RATE);
    const withTone = programmeOnly.map((channel) => concat(tone, channel));
    const layout = { sampleRate: RATE, channels: 2, coding: 'pcm24' } as const;
    const programmePath = temp.write('programme-only.wav', wavFile(layout, encodeSamples(programmeOnly, 'pcm24')));
    const report = await analyzeFile(temp.write('tone-then-programme.wav', wavFile(layout, encodeSamples(withTone, 'pcm24'))));
    expect(report.tone).not.toBeNull();
    expect(report.loudness.leftOut).toEqual({ startSec: report.tone!.startSec, endSec: report.tone!.endSec });
    expect(report.loudness.leftOut!.startSec).toBeLessThan(0.01);
    expect(Math.abs(report.loudness.leftOut!.endSec - 3)).toBeLessThan(0.01);
    // ffmpeg's ebur128 on the programme alone is the outside reference (it prints one decimal: 0.15 LU).
    const reference = ffmpegEbur128(programmePath);
    expect(Math.abs(report.loudness.integratedLufs! - reference.integratedLufs)).toBeLessThanOrEqual(0.15);
    expect(Math.abs(report.loudness.rangeLu! - reference.rangeLu)).toBeLessThanOrEqual(1);
    // The tone's own momentary loudness (about -12 LUFS) is not the maximum; no series point covers it.
    const alone = new LoudnessAnalyzer(formatOf(RATE, 2));
    alone.push({ channels: programmeOnly, frames: programmeOnly[0].length, startFrame: 0 });
    const programmeFigures = alone.finish();
    expect(report.loudness.momentaryMaxLufs!).toBeLessThanOrEqual(programmeFigures.momentaryMaxLufs! + 0.05);
    expect(report.loudness.shortTermMaxLufs!).toBeLessThanOrEqual(programmeFigures.shortTermMaxLufs! + 0.05);
    expect(report.loudness.shortTermSeries!.values.slice(0, 5).every((value) => value === null)).toBe(true);
  });
});

describe('report details', () => {
  it('a mono take has no stereo section; noise-limited bits follow the floor', async () => {
    // A tone over noise at -80 dBFS RMS, so the quiet stretches have a floor to measure.
    const random = seededRandom(4);
    const tone = concat(sine(997, 0.25, 3, RATE), new Float64Array(RATE)).map((x) => x + 1e-4 * Math.sqrt(6) * (random() - random()));
    const report = await analyzeStream(bufferStream(wavFile({ sampleRate: RATE, channels: 1, coding: 'pcm24' }, encodeSamples([tone], 'pcm24'))));
    expect(report.stereo).toBeNull();
    expect(report.file.layout).toBe('mono');
    expect(report.noise.floorDbfs).not.toBeNull();
    // Ideal quantiser noise: -6.02·N - 4.77 dBFS (square-wave reference) -> N = (-floor - 4.77)/6.02.
    expect(report.resolution.noiseLimitedBits).toBeCloseTo((-report.noise.floorDbfs! - 4.77) / 6.02, 1);
    // The long-term spectrum's strongest line is carried into the report: the 997 Hz tone.
    expect(Math.abs(report.bandwidth.peakHz! - 997)).toBeLessThan(1);
  });

  it('a truncated take is analysed and the findings carry a container problem', async () => {
    const file = wavFile({ sampleRate: RATE, channels: 2, coding: 'pcm16' }, encodeSamples(programme(2, 1), 'pcm16'));
    const report = await analyzeStream(bufferStream(file.subarray(0, file.length - RATE * 4)));
    expect(report.file.frames).toBe(RATE);
    expect(report.file.headerIssues!.length).toBeGreaterThan(0);
    expect(report.findings.find((finding) => finding.check === 'container')?.message).toMatch(/cut short/);
  });

  it('a take whose data size was never written is analysed whole', async () => {
    const file = wavFile({ sampleRate: RATE, channels: 1, coding: 'pcm24' }, encodeSamples([sine(997, 0.5, 1.5, RATE)], 'pcm24'), { dataSizeField: 0 });
    const report = await analyzeStream(bufferStream(file));
    expect(report.file.frames).toBe(1.5 * RATE);
    expect(report.findings.some((finding) => finding.check === 'container' && finding.severity === 'warn')).toBe(true);
  });

  it('a take at a rate too low for loudness (4 kHz) is still analysed, with loudness null', async () => {
    const report = await analyzeStream(bufferStream(wavFile({ sampleRate: 4000, channels: 1, coding: 'pcm16' }, encodeSamples([sine(300, 0.5, 3, 4000)], 'pcm16'))));
    expect(report.loudness.integratedLufs).toBeNull();
    expect(report.peak.samplePeakDbfs!).toBeCloseTo(-6.02, 1);
  });

  it('an unreadable stream rejects with UnreadableWavError', async () => {
    await expect(analyzeStream(Readable.from([Buffer.from('not a wav file at all')]))).rejects.toBeInstanceOf(UnreadableWavError);
  });

  it('reports progress in bytes, throttled, ending at the total', async () => {
    const path = temp.write('progress.wav', wavFile({ sampleRate: RATE, channels: 2, coding: 'pcm24' }, encodeSamples(programme(20, 2), 'pcm24')));
    const calls: { done: number; total: number | null; at: number }[] = [];
    const started = Date.now();
    await analyzeFile(path, { parallel: false, onProgress: (done, total) => calls.push({ done, total, at: Date.now() }) });
    const elapsed = Date.now() - started;
    expect(calls.length).toBeGreaterThanOrEqual(2);
    expect(calls.length).toBeLessThanOrEqual(Math.floor(elapsed / PROGRESS_INTERVAL_MS) + 2);
    const last = calls[calls.length - 1];
    expect(last.done).toBe(last.total);
    for (let i = 1; i < calls.length - 1; i++) {
      expect(calls[i].at - calls[i - 1].at).toBeGreaterThanOrEqual(PROGRESS_INTERVAL_MS);
      expect(calls[i].done).toBeGreaterThanOrEqual(calls[i - 1].done);
    }
  });

  it('writes the waveform peaks file when asked', async () => {
    const path = temp.write('peaks-source.wav', wavFile({ sampleRate: RATE, channels: 1, coding: 'pcm16' }, encodeSamples([sine(200, 0.5, 2, RATE)], 'pcm16')));
    const report = await analyzeFile(path, { peaksPath: temp.path('take.peaks') });
    expect(report.waveform?.path).toBe(temp.path('take.peaks'));
    expect(existsSync(temp.path('take.peaks'))).toBe(true);
  });
});

describe('second thread', () => {
  it('the worker gives the same results as the analyzers on this thread', async () => {
    const format = formatOf(RATE, 2, { encoding: 'pcm', bitsPerSample: 24, validBitsPerSample: 24, blockAlign: 6 });
    const remote = await WorkerAnalyzers.start(format);
    expect(remote).not.toBeNull();
    const local = { truePeak: new TruePeakAnalyzer(format), loudness: new LoudnessAnalyzer(format), clipping: new ClippingAnalyzer(format) };
    const signal = programme(12, 3);
    for (let start = 0; start < signal[0].length; start += 65536) {
      const frames = Math.min(65536, signal[0].length - start);
      const block = { channels: signal.map((channel) => channel.slice(start, start + frames)), frames, startFrame: start };
      await remote!.push(block);
      local.truePeak.push(block);
      local.loudness.push(block);
      local.clipping.push(block);
    }
    const results = await remote!.finish();
    expect(results.truePeak).toEqual(local.truePeak.finish());
    expect(results.loudness).toEqual(local.loudness.finish());
    expect(results.clipping).toEqual(local.clipping.finish());
  });

  it('a take large enough for two threads gives the same report either way', async () => {
    const seconds = Math.ceil(PARALLEL_MIN_BYTES / (RATE * 6)) + 5;
    const path = temp.write('long.wav', wavFile({ sampleRate: RATE, channels: 2, coding: 'pcm24' }, encodeSamples(programme(seconds, 4), 'pcm24')));
    const parallel = await analyzeFile(path);
    const single = await analyzeFile(path, { parallel: false });
    expect(parallel).toEqual(single);
  }, 120_000);
});

describe('float samples that are not numbers', () => {
  const clean = () => programme(12, 8);
  const path = (name: string, channels: Float64Array[]) => temp.write(name, wavFile({ sampleRate: RATE, channels: 2, coding: 'float32' }, encodeSamples(channels, 'float32')));

  it('one NaN moves no measure and invents no clipping; the take fails, naming the count and the time', async () => {
    const reference = await analyzeFile(path('finite.wav', clean()));
    const poisoned = clean();
    poisoned[1][Math.round(4.25 * RATE)] = Number.NaN;
    const report = await analyzeFile(path('nan.wav', poisoned));
    expect(Math.abs(report.loudness.integratedLufs! - reference.loudness.integratedLufs!)).toBeLessThan(0.01);
    expect(report.clipping.events).toEqual(reference.clipping.events);
    expect(report.samples).toMatchObject({ nonFinite: 1, firstNonFiniteSec: 4.25 });
    expect(report.channels[1].nonFiniteSamples).toBe(1);
    expect(report.findings.find((finding) => finding.check === 'non-finite')).toMatchObject({ severity: 'fail', channel: 1, startSec: 4.25 });
  });

  it('±Inf samples give a report that survives JSON (as stored), and a take of nothing but NaN does not read as 32-bit audio', async () => {
    const infinite = clean();
    infinite[0][RATE] = Number.POSITIVE_INFINITY;
    infinite[0][RATE + 1] = Number.NEGATIVE_INFINITY;
    const report = await analyzeFile(path('inf.wav', infinite));
    expect(JSON.parse(JSON.stringify(report))).toEqual(report);
    expect(report.samples!.nonFinite).toBe(2);
    const nothing = await analyzeFile(path('all-nan.wav', [new Float64Array(RATE * 3).fill(Number.NaN), new Float64Array(RATE * 3).fill(Number.NaN)]));
    expect(nothing.samples!.nonFinite).toBe(RATE * 6);
    expect(nothing.resolution.effectiveBits).toBe(0);
    expect(nothing.findings.find((finding) => finding.check === 'non-finite')?.severity).toBe('fail');
  });

  it('float samples over full scale are counted, not reported as clipping', async () => {
    // A float stage gained so the loudest sample of 3-4 s reaches +3.5 dBFS.
    const hot = clean().map((channel) => {
      const peak = channel.subarray(3 * RATE, 4 * RATE).reduce((p, x) => Math.max(p, Math.abs(x)), 0);
      return channel.map((x, i) => (i >= 3 * RATE && i < 4 * RATE ? (1.5 / peak) * x : x));
    });
    const report = await analyzeFile(path('hot.wav', hot));
    expect(report.samples!.overFullScale).toBeGreaterThan(0);
    expect(report.clipping.events).toEqual([]);
    expect(report.findings.some((finding) => finding.check === 'over-full-scale' && finding.severity === 'warn')).toBe(true);
  });
});

describe('poly takes: iso tracks named in iXML', () => {
  const names = ['Boom', 'Lav Anna', 'Lav Ben', 'Lav 4'];
  const ixml = `<BWFXML><TRACK_LIST><TRACK_COUNT>4</TRACK_COUNT>${names.map((name, index) => `<TRACK><CHANNEL_INDEX>${index + 1}</CHANNEL_INDEX><INTERLEAVE_INDEX>${index + 1}</INTERLEAVE_INDEX><NAME>${name}</NAME></TRACK>`).join('')}</TRACK_LIST></BWFXML>`;
  let path: string;
  let report: AnalysisReport;
  beforeAll(async () => {
    const [a, b] = programme(12, 9);
    const boom = a.map((x, i) => 0.5 * x + 0.5 * b[i]);
    // iXML after the audio, as many recorders write it: the layout is known only at the end of the read.
    path = temp.write('poly.wav', wavFile({ sampleRate: RATE, channels: 4, coding: 'pcm24' }, encodeSamples([boom, a, b.map((x) => 0.3 * x), new Float64Array(a.length)], 'pcm24'), { chunksAfterData: [{ id: 'iXML', body: Buffer.from(ixml) }] }));
    report = await analyzeFile(path);
  });

  it('is measured track by track: names, each track\'s own loudness (within 0.15 LU of ffmpeg on that track alone), no whole-take loudness', () => {
    expect(report.file.layout).toBe('poly');
    expect(report.channels.map((channel) => channel.name)).toEqual(names);
    expect(report.loudness.integratedLufs).toBeNull();
    expect(report.stereo).toBeNull();
    for (const track of [0, 1, 2]) {
      const single = temp.path(`track-${track}.wav`);
      expect(spawnSync('sox', [path, single, 'remix', String(track + 1)]).status).toBe(0);
      // ffmpeg's ebur128 is an independent BS.1770 implementation; it prints one decimal.
      expect(Math.abs(report.channels[track].integratedLufs! - ffmpegEbur128(single).integratedLufs)).toBeLessThanOrEqual(0.15);
    }
    expect(report.channels[3].integratedLufs).toBeNull();
  });

  it('an unused track is a note, not a failure; findings name tracks', () => {
    const unused = report.findings.find((finding) => finding.check === 'silent-channel');
    expect(unused).toMatchObject({ severity: 'info', channel: 3, message: 'Track 4 (Lav 4) carries no signal: an unused track.' });
    expect(report.findings.filter((finding) => finding.check === 'silent-channel' || finding.check === 'loudness').every((finding) => finding.severity === 'info')).toBe(true);
  });
});
