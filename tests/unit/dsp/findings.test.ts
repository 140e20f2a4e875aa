import { describe, expect, it } from 'vitest';
import { REASON_MAX_LENGTH, judgeReport, reasonOf, verdictOf } from '../../../dsp/findings';
import { formatClock } from '../../../dsp/format';
import { DEFAULT_SPEC, type DeliverySpec } from '../../../dsp/spec';
import type { AnalysisReport, Finding } from '../../../dsp/types';

/** A report of a clean 24-bit stereo take at -23 LUFS. */
function cleanReport(): AnalysisReport {
  const channel = { samplePeakDbfs: -6, truePeakDbtp: -5.8, rmsDbfs: -26, dcOffset: 0.00001, effectiveBits: 24, clippedSamples: 0, silent: false };
  return {
    file: { container: 'RIFF', encoding: 'pcm', sampleRate: 48000, bitsPerSample: 24, channels: 2, frames: 480000, durationSec: 10, headerIssues: [] },
    bext: null,
    channels: [{ ...channel }, { ...channel }],
    resolution: { effectiveBits: 24, noiseLimitedBits: 16 },
    peak: { samplePeakDbfs: -6, truePeakDbtp: -5.8 },
    clipping: { clippedSamples: 0, events: [] },
    loudness: { integratedLufs: -23.2, rangeLu: 6, momentaryMaxLufs: -15, shortTermMaxLufs: -18 },
    noise: { floorDbfs: -80, humHz: null },
    bandwidth: { effectiveHz: 20000, impliedSourceRate: null, nearNyquistDb: -70, aliasingRisk: false },
    dropouts: [],
    stereo: { correlation: 0.4, identicalChannels: false, polarityInverted: false, antiPhaseShare: 0 },
    tone: null,
    findings: [],
  };
}

const judge = (change: (report: AnalysisReport) => void, spec: DeliverySpec = DEFAULT_SPEC) => {
  const report = cleanReport();
  change(report);
  return judgeReport(report, spec);
};
const only = (findings: Finding[], check: Finding['check']) => findings.filter((finding) => finding.check === check);

describe('judgeReport', () => {
  it('finds nothing wrong with a clean take at the target', () => {
    const findings = judgeReport(cleanReport(), DEFAULT_SPEC);
    expect(findings.filter((finding) => finding.severity !== 'info')).toEqual([]);
    expect(verdictOf(findings)).toBe('pass');
  });

  it('is pure: leaves the report untouched and gives the same answer twice', () => {
    const report = cleanReport();
    report.clipping.events.push({ channel: 0, startSec: 1, endSec: 1.2, level: 'fullScale', levelDbfs: 0 });
    const frozen = JSON.stringify(report);
    const first = judgeReport(report, DEFAULT_SPEC);
    expect(JSON.stringify(report)).toBe(frozen);
    expect(judgeReport(report, DEFAULT_SPEC)).toEqual(first);
  });

  it('container: each header issue becomes a warning', () => {
    const findings = only(judge((r) => (r.file.headerIssues = ['The header declares 10 MiB of audio but the file holds only 2 MiB: it was probably cut short.'])), 'container');
    expect(findings).toEqual([{ check: 'container', severity: 'warn', message: expect.stringMatching(/cut short/) }]);
  });

  it('format and sample-rate: the delivery\'s required depth and rate', () => {
    const spec = { ...DEFAULT_SPEC, requiredBitDepth: 16 as const, requiredSampleRate: 44100 };
    const findings = judge(() => {}, spec);
    expect(only(findings, 'format')[0]).toMatchObject({ severity: 'fail', message: 'The file is 24-bit; the delivery asks for 16-bit.' });
    expect(only(findings, 'sample-rate')[0]).toMatchObject({ severity: 'fail', message: 'The take is 48 kHz; the delivery asks for 44.1 kHz.' });
    expect(only(judge((r) => (r.file.encoding = 'float'), { ...DEFAULT_SPEC, requiredBitDepth: 24 }), 'format')[0].severity).toBe('fail');
  });

  it('resolution: 16 of 24 bits used', () => {
    const findings = only(judge((r) => (r.resolution.effectiveBits = 16)), 'resolution');
    expect(findings[0]).toMatchObject({ severity: 'fail', message: 'Only 16 of 24 bits carry audio: the recorder was likely set to 16-bit.' });
  });

  it('clipping: fails past the allowed count, with channel and time', () => {
    const findings = only(judge((r) => {
      r.clipping.events = [
        { channel: 1, startSec: 61.25, endSec: 61.3, level: 'fullScale', levelDbfs: 0 },
        { channel: 1, startSec: 75, endSec: 75.1, level: 'belowFullScale', levelDbfs: -6.2 },
      ];
    }), 'clipping');
    expect(findings).toHaveLength(2);
    expect(findings[0]).toMatchObject({ severity: 'fail', channel: 1, startSec: 61.25, endSec: 61.3, message: '1 clipping event on right channel at full scale (at 1:01.3).' });
    expect(findings[1].message).toMatch(/flat-topped at -6.2 dBFS.*before the converter clipped/);
    expect(only(judge((r) => (r.clipping.events = [{ channel: 0, startSec: 1, endSec: 2, level: 'fullScale', levelDbfs: 0 }]), { ...DEFAULT_SPEC, maxClipEvents: 3 }), 'clipping')[0].severity).toBe('warn');
  });

  it('true-peak: above the limit warns on a raw take, fails on a strict delivery or above 0 dBTP', () => {
    expect(only(judge((r) => (r.channels[0].truePeakDbtp = -0.5)), 'true-peak')[0]).toMatchObject({ severity: 'warn', channel: 0 });
    expect(only(judge((r) => (r.channels[0].truePeakDbtp = -0.5), { ...DEFAULT_SPEC, loudnessIsStrict: true }), 'true-peak')[0].severity).toBe('fail');
    expect(only(judge((r) => (r.channels[1].truePeakDbtp = 0.4)), 'true-peak')[0]).toMatchObject({ severity: 'fail', channel: 1 });
  });

  it('true-peak: says when the peak happens, so the review page can mark it', () => {
    const finding = only(
      judge((r) => {
        r.channels[1].truePeakDbtp = 1.2;
        r.channels[1].truePeakAtSec = 74.31;
      }),
      'true-peak',
    )[0];
    expect(finding).toMatchObject({ startSec: 74.31, endSec: 74.31, channel: 1 });
    expect(finding.message).toBe('True peak on right channel reaches 1.2 dBTP at 1:14.3, above the -1.0 dBTP limit.');
  });

  it('loudness: outside the tolerance band, and a take too short to measure', () => {
    const loud = only(judge((r) => (r.loudness.integratedLufs = -16.04)), 'loudness')[0];
    expect(loud).toMatchObject({ severity: 'warn', message: 'Integrated loudness is -16.0 LUFS, 7.0 LU louder than the -23.0 LUFS target (±1 LU).' });
    expect(only(judge((r) => (r.loudness.integratedLufs = -23.9)), 'loudness')).toEqual([]);
    expect(only(judge((r) => (r.loudness.integratedLufs = null)), 'loudness')[0].severity).toBe('info');
  });

  it('noise-floor, hum, bandwidth, aliasing', () => {
    const findings = judge((r) => {
      r.noise = { floorDbfs: -52, humHz: 50 };
      r.bandwidth = { effectiveHz: 15000, impliedSourceRate: null, nearNyquistDb: -10, aliasingRisk: true };
    });
    expect(only(findings, 'noise-floor')[0].message).toBe('The noise floor in the quiet passages is -52.0 dBFS, above the -60.0 dBFS limit.');
    expect(only(findings, 'hum')[0].message).toMatch(/50 Hz/);
    expect(only(findings, 'bandwidth')[0].message).toMatch(/reaches only 15 kHz/);
    expect(only(findings, 'aliasing')[0].severity).toBe('warn');
    const upsampled = judge((r) => (r.bandwidth = { effectiveHz: 16000, impliedSourceRate: 32000, nearNyquistDb: -90, aliasingRisk: false }));
    expect(only(upsampled, 'sample-rate')[0].message).toMatch(/made at 32 kHz and converted up to 48 kHz/);
  });

  it('dc-offset: warns past the limit, fails at ten times it', () => {
    expect(only(judge((r) => (r.channels[0].dcOffset = 0.002)), 'dc-offset')[0]).toMatchObject({ severity: 'warn', channel: 0 });
    expect(only(judge((r) => (r.channels[1].dcOffset = -0.02)), 'dc-offset')[0]).toMatchObject({ severity: 'fail', channel: 1 });
  });

  it('dc-offset: judged on the steady offset of the quiet passages when it was measured, not on the mean of an asymmetric waveform', () => {
    expect(only(judge((r) => Object.assign(r.channels[0], { dcOffset: 0.004, steadyDcOffset: 0 })), 'dc-offset')).toEqual([]);
    expect(only(judge((r) => Object.assign(r.channels[0], { dcOffset: 0.004, steadyDcOffset: 0.003 })), 'dc-offset')[0].message).toMatch(/0.30% of full scale/);
  });

  it('dropout: counts, times and severity', () => {
    const finding = only(judge((r) => (r.dropouts = [{ startSec: 3.2, endSec: 3.225 }])), 'dropout')[0];
    expect(finding).toMatchObject({ severity: 'fail', startSec: 3.2, endSec: 3.225, message: '1 dropout (digital silence inside the take) at 0:03.2 (25 ms).' });
  });

  it('silent-channel: one dead channel, or a silent take', () => {
    expect(only(judge((r) => (r.channels[1].silent = true)), 'silent-channel')[0]).toMatchObject({ severity: 'fail', channel: 1 });
    const allSilent = only(judge((r) => r.channels.forEach((channel) => (channel.silent = true))), 'silent-channel');
    expect(allSilent).toHaveLength(1);
    expect(allSilent[0].message).toMatch(/whole take is silent/);
  });

  it('a file without audio fails as a container problem, not as silence', () => {
    const findings = judge((r) => {
      r.file.frames = 0;
      r.channels.forEach((channel) => (channel.silent = true));
    });
    expect(only(findings, 'container')).toEqual([{ check: 'container', severity: 'fail', message: 'The file holds no audio at all.' }]);
    expect(only(findings, 'silent-channel')).toEqual([]);
  });

  it('stereo: identical channels, inverted polarity (whole take or a stretch); anti-phase windows alone are no fault', () => {
    expect(only(judge((r) => (r.stereo!.identicalChannels = true)), 'stereo')[0].message).toMatch(/mono take in a stereo file/);
    const inverted = only(judge((r) => Object.assign(r.stereo!, { polarityInverted: true, correlation: -0.93, invertedSegments: 2, invertedFromSec: 0, invertedToSec: 10 })), 'stereo')[0];
    expect(inverted).toMatchObject({ severity: 'warn', message: expect.stringMatching(/opposite polarity: one of them is probably wired inverted/) });
    const stretch = only(judge((r) => Object.assign(r.stereo!, { polarityInverted: true, invertedSegments: 1, inPolaritySegments: 1, invertedFromSec: 0, invertedToSec: 5 })), 'stereo')[0];
    expect(stretch).toMatchObject({ startSec: 0, endSec: 5, message: expect.stringMatching(/from 0:00.0 to 0:05.0/) });
    // Two voices on two microphones are unrelated, so some windows read negative: no warning on that alone.
    expect(only(judge((r) => (r.stereo!.antiPhaseShare = 0.2)), 'stereo')).toEqual([]);
  });

  it('tone: reported as information, and a tone shifted by a wrong rate flags the rate', () => {
    const findings = judge((r) => (r.tone = { startSec: 0, endSec: 10, frequencyHz: 918.8, levelDbfs: -18, sinadDb: 80, thdnDb: -80, enobBits: 16, likelyRecordedRate: 44100 }));
    expect(only(findings, 'tone')[0].severity).toBe('info');
    expect(only(findings, 'sample-rate')[0].message).toMatch(/recorded at 44.1 kHz and is labelled 48 kHz/);
    // The take plays at the wrong speed and pitch: a failure by default [common practice].
    expect(only(findings, 'sample-rate')[0].severity).toBe('fail');
  });

  it('noise-floor: a low signal-to-noise ratio warns under 25 dB and fails under 15 dB (engine defaults [common practice])', () => {
    expect(only(judge((r) => (r.noise.snrDb = 40)), 'noise-floor')).toEqual([]);
    expect(only(judge((r) => (r.noise.snrDb = 20)), 'noise-floor')[0]).toMatchObject({ severity: 'warn', message: expect.stringMatching(/only 20.0 dB over the noise floor/) });
    expect(only(judge((r) => (r.noise.snrDb = 8.6)), 'noise-floor')[0].severity).toBe('fail');
  });

  it('loudness: names the line-up tone left out of the measurement', () => {
    const findings = judge((r) => {
      r.loudness.integratedLufs = -30;
      r.loudness.leftOut = { startSec: 0, endSec: 30 };
    });
    expect(only(findings, 'loudness')[0].message).toMatch(/line-up tone from 0:00.0 to 0:30.0 left out/);
  });

  it('re-judges a stored report under a different spec without the audio', () => {
    const report = cleanReport();
    report.loudness.integratedLufs = -16;
    expect(verdictOf(judgeReport(report, DEFAULT_SPEC))).toBe('warn');
    expect(verdictOf(judgeReport(report, { ...DEFAULT_SPEC, loudnessTargetLufs: -16 }))).toBe('pass');
    expect(verdictOf(judgeReport(report, { ...DEFAULT_SPEC, loudnessIsStrict: true }))).toBe('fail');
  });
});

describe('non-finite and over-full-scale float samples', () => {
  it('fails a take with samples that are not numbers, saying how many and when the first one is', () => {
    const finding = only(judge((r) => {
      r.samples = { nonFinite: 3, firstNonFiniteSec: 2.5, overFullScale: 0, firstOverFullScaleSec: null };
      r.channels[1].nonFiniteSamples = 3;
    }), 'non-finite')[0];
    expect(finding).toMatchObject({ severity: 'fail', channel: 1, startSec: 2.5 });
    expect(finding.message).toMatch(/^3 samples are not a number \(NaN or infinity\), the first at 0:02.5 on right channel/);
  });

  it('warns of float samples beyond full scale as a finding of their own, not as clipping', () => {
    const findings = judge((r) => {
      r.file.encoding = 'float';
      r.file.bitsPerSample = 32;
      r.peak.samplePeakDbfs = 3;
      r.samples = { nonFinite: 0, firstNonFiniteSec: null, overFullScale: 1200, firstOverFullScaleSec: 3.1 };
    });
    expect(only(findings, 'clipping')).toEqual([]);
    expect(only(findings, 'over-full-scale')[0]).toMatchObject({ severity: 'warn', startSec: 3.1, message: expect.stringMatching(/not clipped yet, but they will clip when converted to fixed point/) });
  });
});

describe('poly takes (iso tracks)', () => {
  const poly = (r: AnalysisReport) => {
    r.file.layout = 'poly';
    r.file.channels = 3;
    r.stereo = null;
    r.loudness.integratedLufs = null;
    const channel = r.channels[0];
    r.channels = [
      { ...channel, name: 'Boom', integratedLufs: -30 },
      { ...channel, name: 'Lav Anna', integratedLufs: -27 },
      { ...channel, name: 'Lav 3', silent: true, silentKind: 'noise-only', integratedLufs: null },
    ];
  };

  it('an unused track is a note, not a failure; no whole-take loudness is judged', () => {
    const findings = judge(poly);
    expect(findings.filter((finding) => finding.severity !== 'info')).toEqual([]);
    expect(only(findings, 'silent-channel')[0]).toMatchObject({ severity: 'info', channel: 2, message: 'Track 3 (Lav 3) carries only a steady noise, no programme: an unused track.' });
    expect(only(findings, 'loudness')).toEqual([]);
  });

  it('a poly take whose quietest track is over the floor limit warns about that track (iso tracks [common practice])', () => {
    const findings = judge((r) => {
      poly(r);
      r.noise = { floorDbfs: -55, humHz: null, basis: 'quiet-passages', snrDb: null };
    });
    expect(only(findings, 'noise-floor')[0]).toMatchObject({ severity: 'warn', message: 'The noise floor of the quietest track is -55.0 dBFS, above the -60.0 dBFS limit.' });
  });

  it('names tracks by their iXML names in findings', () => {
    const findings = judge((r) => {
      poly(r);
      r.clipping.events = [{ channel: 1, startSec: 5, endSec: 5.2, level: 'belowFullScale', levelDbfs: -10 }];
    });
    expect(only(findings, 'clipping')[0].message).toMatch(/on track 2 \(Lav Anna\), flat-topped at -10.0 dBFS/);
  });
});

describe('what cannot be judged is said, not alarmed', () => {
  it('an empty LFE channel in a surround take is a note', () => {
    const findings = judge((r) => {
      r.file.layout = 'surround';
      r.file.channels = 6;
      r.stereo = null;
      r.channels = ['L', 'R', 'C', 'LFE', 'Ls', 'Rs'].map((name) => ({ ...r.channels[0], name, silent: name === 'LFE', silentKind: name === 'LFE' ? ('no-signal' as const) : null }));
    });
    expect(only(findings, 'silent-channel')).toEqual([{ check: 'silent-channel', severity: 'info', channel: 3, message: 'The LFE channel carries no signal: normal when the programme has no low-frequency effects.' }]);
  });

  it('two channels with nothing in common: polarity cannot be checked, said as a note', () => {
    const findings = only(judge((r) => Object.assign(r.stereo!, { inPolaritySegments: 0, invertedSegments: 0 })), 'stereo');
    expect(findings).toHaveLength(1);
    expect(findings[0]).toMatchObject({ severity: 'info', message: expect.stringMatching(/relative polarity cannot be checked/) });
    // Reports made before the comparison existed say nothing.
    expect(only(judgeReport(cleanReport(), DEFAULT_SPEC), 'stereo')).toEqual([]);
  });
});

describe('reasonOf: one line for the verdict', () => {
  it('is null for a take that passes, and the worst finding in at most 90 characters otherwise', () => {
    expect(reasonOf(judgeReport(cleanReport(), DEFAULT_SPEC))).toBeNull();
    const findings = judge((r) => {
      r.loudness.integratedLufs = -16;
      r.clipping.events = [1, 2, 3].map((t) => ({ channel: 0, startSec: t, endSec: t + 0.1, level: 'belowFullScale' as const, levelDbfs: -3 }));
    });
    expect(reasonOf(findings)).toBe('Clipped before the converter: 3 flat tops at -3.0 dBFS on left channel');
  });

  it('prefers a failure over a warning, and shortens a long message at a clause', () => {
    const long: Finding = { check: 'container', severity: 'warn', message: `The header declares 1.2 GiB of audio but the file holds only 0.8 GiB: it was probably cut short. ${'x'.repeat(80)}` };
    expect(reasonOf([long])).toBe('The header declares 1.2 GiB of audio but the file holds only 0.8 GiB');
    expect(reasonOf([long, { check: 'dropout', severity: 'fail', message: 'x', summary: '1 dropout (digital silence), first at 0:03.2' }])).toBe('1 dropout (digital silence), first at 0:03.2');
    expect(reasonOf([{ check: 'tone', severity: 'info', message: 'Line-up tone' }])).toBeNull();
    const unbroken = only(judge((r) => (r.file.headerIssues = ['y '.repeat(100)])), 'container');
    expect(reasonOf(unbroken)!.length).toBeLessThanOrEqual(REASON_MAX_LENGTH);
  });
});

describe('verdictOf and formatClock', () => {
  it('takes the worst severity', () => {
    const finding = (severity: Finding['severity']): Finding => ({ check: 'loudness', severity, message: '' });
    expect(verdictOf([])).toBe('pass');
    expect(verdictOf([finding('info')])).toBe('pass');
    expect(verdictOf([finding('info'), finding('warn')])).toBe('warn');
    expect(verdictOf([finding('warn'), finding('fail'), finding('info')])).toBe('fail');
  });

  it('writes times as m:ss.s or h:mm:ss.s', () => {
    expect(formatClock(3.24)).toBe('0:03.2');
    expect(formatClock(61.25)).toBe('1:01.3');
    expect(formatClock(3723.5)).toBe('1:02:03.5');
  });
});
