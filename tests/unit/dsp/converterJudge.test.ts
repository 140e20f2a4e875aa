import { describe, expect, it } from 'vitest';
import { judgeConverterCheck } from '../../../dsp/converter/judge';
import type { ConverterChannelReport, ConverterReport } from '../../../dsp/converter/report';
import { converterThresholdsSchema, DEFAULT_CONVERTER_THRESHOLDS, type ConverterThresholds } from '../../../dsp/converter/thresholds';

/** A healthy 48 kHz 24-bit stereo converter (figures of a good studio interface, invented). */
function healthyChannel(overrides: Partial<ConverterChannelReport> = {}): ConverterChannelReport {
  return {
    dead: false, clippedSamples: 0, gainDb: 0.05, polarityInverted: false, thdnDb: { minus1: -105, minus20: -98 }, sinadDb: 104, enobBits: 17, dynamicRangeDb: 114,
    dynamicRangeDbA: 117, noiseFloorDbfs: -114, noiseFloorDbfsA: -117, noiseFloorFullBandDbfs: -113, frequencyResponse: { hz: [20, 997, 20000], db: [-0.05, 0, -0.1] },
    passbandDeviationDb: 0.1, bandEdgeHz: 22500, delaySamples: 0, crosstalkIntoDb: -110, ...overrides,
  };
}

function check(changes: Partial<ConverterReport> = {}, channelChanges: Partial<ConverterChannelReport>[] = [{}, {}]): ConverterReport {
  return {
    kind: 'converter-check', signalVersion: 1, levelReference: 'dB FS, full-scale sine = 0 dB FS',
    file: { container: 'RIFF', encoding: 'pcm', sampleRate: 48000, bitsPerSample: 24, channels: 2, frames: 1_700_000, durationSec: 35.4 },
    signal: { startSec: 4, endSec: 31.5, markerMatch: 0.99, writtenSampleRate: 48000, writtenBits: 24 },
    clockErrorPpm: 12, crosstalkDb: -110, crosstalkTonesHz: [997, 9973], crosstalkPaths: [], channelGainMismatchDb: 0, interChannelDelaySamples: 0,
    bands: { thdnHz: [20, 20000], noiseHz: [20, 20000], passbandHz: [20, 20000], responseHz: [19.78, 23760], sinad: 'DC excluded, up to Nyquist (IEEE 1241)' },
    findings: [],
    channels: channelChanges.map((channel) => healthyChannel(channel)),
    ...changes,
  };
}

const judge = (report: ConverterReport, baseline: ConverterReport | null = null, thresholds: ConverterThresholds = DEFAULT_CONVERTER_THRESHOLDS) =>
  judgeConverterCheck(report, baseline, thresholds);
const problems = (report: ConverterReport, baseline: ConverterReport | null = null, thresholds?: ConverterThresholds) =>
  judge(report, baseline, thresholds).filter((finding) => finding.severity !== 'info');

describe('judging a converter check', () => {
  it('finds nothing wrong with a healthy converter, and says the check can become the baseline', () => {
    const findings = judge(check());
    expect(findings.filter((finding) => finding.severity !== 'info')).toEqual([]);
    expect(findings).toEqual([expect.objectContaining({ check: 'baseline', severity: 'info', message: expect.stringMatching(/No baseline yet/) })]);
  });

  it.each([
    ['polarity', 'fail', check({}, [{}, { polarityInverted: true }]), 1, /Right channel is polarity-inverted/],
    ['clock', 'warn', check({ clockErrorPpm: -80 }), undefined, /80\.0 ppm fast against the player's/],
    ['gain', 'fail', check({}, [{ gainDb: -1.4 }, {}]), 0, /Left channel records the −1 dB FS tone −1\.40 dB off/],
    ['channel-balance', 'fail', check({ channelGainMismatchDb: 0.45 }), undefined, /differ by 0\.45 dB/],
    ['delay', 'warn', check({ interChannelDelaySamples: 3 }, [{}, { delaySamples: 3 }]), 1, /3 samples later than left channel/],
    ['distortion', 'fail', check({}, [{}, { thdnDb: { minus1: -72, minus20: -90 } }]), 1, /−72\.0 dB THD\+N/],
    ['resolution', 'fail', check({}, [{ enobBits: 12.4 }, {}]), 0, /12\.4 effective bits/],
    ['dynamic-range', 'fail', check({}, [{ dynamicRangeDb: 84.2 }, {}]), 0, /84\.2 dB dynamic range/],
    ['noise', 'fail', check({}, [{}, { noiseFloorDbfs: -82.5 }]), 1, /idles at −82\.5 dB FS/],
    ['response', 'fail', check({}, [{ passbandDeviationDb: 1.2 }, {}]), 0, /strays 1\.20 dB/],
    ['band-edge', 'fail', check({}, [{ bandEdgeHz: 15980 }, {}]), 0, /3 dB down at 15\.98 kHz/],
    ['crosstalk', 'fail', check({ crosstalkDb: -62.3 }), undefined, /−62\.3 dB between channels/],
    ['overload', 'fail', check({}, [{ clippedSamples: 412 }, {}]), 0, /lower the playback level/],
    ['dead-channel', 'fail', check({}, [{}, { dead: true }]), 1, /Right channel carries no trace/],
  ] as const)('a %s beyond its limit is a %s finding in plain words', (name, severity, report, channel, message) => {
    const found = problems(report);
    expect(found).toHaveLength(1);
    expect(found[0]).toMatchObject({ check: name, severity, message: expect.stringMatching(message) });
    expect(found[0].channel).toBe(channel);
  });

  it('warns about drift against the baseline at the thresholds, not below them', () => {
    const baseline = check();
    const drifted = check({ clockErrorPpm: 12 + 20, crosstalkDb: -104 }, [
      { noiseFloorDbfs: -114 + 3, enobBits: 17 - 0.5, dynamicRangeDb: 114 - 3, thdnDb: { minus1: -105 + 6, minus20: -98 }, gainDb: 0.05 + 0.5, bandEdgeHz: 22500 * 0.98 },
      { delaySamples: 1 },
    ]);
    const drift = problems(drifted, baseline).filter((finding) => finding.basis === 'baseline');
    expect(drift.map((finding) => [finding.check, finding.channel])).toEqual([
      ['clock', undefined], ['noise', 0], ['resolution', 0], ['dynamic-range', 0], ['distortion', 0], ['gain', 0], ['band-edge', 0], ['delay', 1], ['crosstalk', undefined],
    ]);
    expect(drift.every((finding) => finding.severity === 'warn')).toBe(true);
    expect(drift.find((finding) => finding.check === 'noise')!.message).toBe('Left channel\'s idle noise rose 3.0 dB since the baseline (−114.0 dB → −111.0 dB FS).');

    const almost = check({ clockErrorPpm: 12 + 19.9, crosstalkDb: -104.1 }, [
      { noiseFloorDbfs: -114 + 2.9, enobBits: 17 - 0.49, dynamicRangeDb: 114 - 2.9, thdnDb: { minus1: -105 + 5.9, minus20: -98 }, gainDb: 0.05 + 0.49, bandEdgeHz: 22500 * 0.981 },
      {},
    ]);
    expect(problems(almost, baseline).filter((finding) => finding.basis === 'baseline')).toEqual([]);
  });

  it('follows the thresholds a manager set for the recorder model', () => {
    const baseline = check();
    const noisier = check({}, [{ noiseFloorDbfs: -110 }, {}]);
    expect(problems(noisier, baseline).map((finding) => finding.check)).toEqual(['noise']);
    expect(problems(noisier, baseline, { ...DEFAULT_CONVERTER_THRESHOLDS, noiseRiseDb: 6 })).toEqual([]);
    expect(problems(noisier, null, { ...DEFAULT_CONVERTER_THRESHOLDS, maxNoiseFloorDbfs: -112 })).toEqual([expect.objectContaining({ check: 'noise', basis: 'threshold', value: -110, reference: -112 })]);
  });

  it('notices a response edge that appeared or vanished since the baseline', () => {
    const flatToTheTop = check({}, [{ bandEdgeHz: null }, { bandEdgeHz: null }]);
    expect(problems(check(), flatToTheTop).map((finding) => [finding.check, finding.channel])).toEqual([['band-edge', 0], ['band-edge', 1]]);
  });

  it('does not compare with a baseline made at another rate or channel count, and says so', () => {
    const baseline = check({ file: { ...check().file, sampleRate: 96000 } }, [{ noiseFloorDbfs: -130 }, {}]);
    const findings = judge(check(), baseline);
    expect(findings).toEqual([expect.objectContaining({ check: 'baseline', severity: 'info', message: expect.stringMatching(/96 kHz.*not compared/) })]);
  });

  it('explains that a 16-bit check signal caps the dynamic range it can show on a 24-bit recorder', () => {
    const findings = judge(check({ signal: { ...check().signal, writtenBits: 16 } }, [{ dynamicRangeDb: 93.9 }, { dynamicRangeDb: 94 }]));
    expect(findings).toContainEqual(expect.objectContaining({ check: 'signal', severity: 'info', message: expect.stringMatching(/written at 16 bits.*Write it at 24 bits/) }));
  });

  it('is pure: the reports are left as they were and the same inputs give the same findings', () => {
    const report = Object.freeze(check({}, [{ noiseFloorDbfs: -80 }, {}]));
    const baseline = Object.freeze(check());
    const first = judge(report, baseline);
    expect(judge(report, baseline)).toEqual(first);
    expect(report.findings).toEqual([]);
  });

  it('accepts the default thresholds and refuses impossible ones', () => {
    expect(converterThresholdsSchema.parse(DEFAULT_CONVERTER_THRESHOLDS)).toEqual(DEFAULT_CONVERTER_THRESHOLDS);
    expect(converterThresholdsSchema.safeParse({ ...DEFAULT_CONVERTER_THRESHOLDS, minEnobBits: -3 }).success).toBe(false);
    expect(converterThresholdsSchema.safeParse({ ...DEFAULT_CONVERTER_THRESHOLDS, maxNoiseFloorDbfs: 6 }).success).toBe(false);
  });
});
