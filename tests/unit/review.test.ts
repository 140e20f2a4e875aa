import { describe, expect, it } from 'vitest';
import { judgeReport } from '@/dsp/findings';
import { DEFAULT_SPEC } from '@/dsp/spec';
import type { AnalysisReport } from '@/dsp/types';
import { formatClock, formatMeasure, parseClock } from '@/lib/format';
import { cueTime, hearingCaution, measureRows, neighbourMarker, timedMarkers } from '@/lib/review/reportView';

/** A plausible report of a 10 s stereo 24-bit take, judged by the real rules; `patch` adds the problems. */
function report(patch: (r: AnalysisReport) => void = () => undefined): AnalysisReport {
  const channel = { samplePeakDbfs: -6, truePeakDbtp: -5.8, rmsDbfs: -24, dcOffset: 0, effectiveBits: 24, clippedSamples: 0, silent: false };
  const r: AnalysisReport = {
    file: { container: 'RIFF', encoding: 'pcm', sampleRate: 48000, bitsPerSample: 24, channels: 2, frames: 480000, durationSec: 10 },
    bext: null,
    channels: [{ ...channel }, { ...channel }],
    resolution: { effectiveBits: 24, noiseLimitedBits: null },
    peak: { samplePeakDbfs: -6, truePeakDbtp: -5.8 },
    clipping: { clippedSamples: 0, events: [] },
    loudness: { integratedLufs: -23.2, rangeLu: 6, momentaryMaxLufs: -15, shortTermMaxLufs: -18 },
    noise: { floorDbfs: -75, humHz: null },
    bandwidth: { effectiveHz: 21000, impliedSourceRate: null, nearNyquistDb: -60, aliasingRisk: false },
    dropouts: [],
    stereo: { correlation: 0.6, identicalChannels: false, polarityInverted: false },
    tone: null,
    findings: [],
  };
  patch(r);
  r.findings = judgeReport(r, DEFAULT_SPEC);
  return r;
}

const hot = () =>
  report((r) => {
    r.clipping.events = [
      { channel: 1, startSec: 4, endSec: 4.3, level: 'fullScale', levelDbfs: 0 },
      { channel: 0, startSec: 2, endSec: 2.0001, level: 'belowFullScale', levelDbfs: -3 },
    ];
    r.clipping.clippedSamples = 500;
    r.peak = { samplePeakDbfs: 0, truePeakDbtp: 0.4 };
    r.channels[1].truePeakDbtp = 0.4;
    r.dropouts = [{ startSec: 6, endSec: 6.05 }];
    r.tone = { startSec: 0, endSec: 1, frequencyHz: 1000, levelDbfs: -18, sinadDb: 80, thdnDb: -80, enobBits: 13, likelyRecordedRate: null };
  });

describe('timedMarkers', () => {
  it('places every clip, flat top, dropout and the tone in time order, with severity and a label', () => {
    const markers = timedMarkers(hot());
    expect(markers.map((m) => [m.kind, m.startSec, m.severity, m.label])).toEqual([
      ['tone', 0, 'info', 'Line-up tone'],
      ['flat-top', 2, 'fail', 'Flat top L'],
      ['clip', 4, 'fail', 'Clip R'],
      ['dropout', 6, 'fail', 'Dropout'],
    ]);
    // A one-sample event still gets a region wide enough to see and click.
    expect(markers[1].endSec - markers[1].startSec).toBeGreaterThanOrEqual(0.02);
    expect(markers[2].channel).toBe(1);
  });

  it('marks nothing on a clean take', () => {
    expect(timedMarkers(report())).toEqual([]);
  });
});

describe('measureRows', () => {
  it('marks each measure from the findings of its own checks', () => {
    const rows = Object.fromEntries(measureRows(hot(), DEFAULT_SPEC).map((r) => [r.key, r]));
    expect(rows.peaks.mark).toBe('fail');
    expect(rows.dropouts.mark).toBe('fail');
    expect(rows.loudness.mark).toBe('pass');
    expect(rows.noise.mark).toBe('pass');
    expect(rows.tone.mark).toBe('pass');
    expect(rows.loudness.value).toContain('target -23.0 LUFS ± 1 LU');
  });

  it('claims no pass for a noise floor that could not be measured (dense material, no quiet passage)', () => {
    const dense = report((r) => {
      r.noise = { ...r.noise, floorDbfs: null, humHz: null };
    });
    const noise = measureRows(dense, DEFAULT_SPEC).find((r) => r.key === 'noise')!;
    expect(noise.mark).toBe('none');
    expect(noise.value).toBe('not measurable: no quiet passage');
  });

  it('says how many bits a padded file really uses', () => {
    const padded = report((r) => {
      r.resolution.effectiveBits = 16;
    });
    const format = measureRows(padded, DEFAULT_SPEC).find((r) => r.key === 'format')!;
    expect(format.value).toMatch(/^24-bit file, 16 bits used/);
    expect(format.mark).toBe('fail');
    expect(format.explanation).toMatch(/Only 16 of 24 bits carry audio/);
  });

  it('says what the row’s own findings found, never a reassuring sentence beside a warning', () => {
    const upsampled = report((r) => {
      r.bandwidth = { ...r.bandwidth, effectiveHz: 11800, impliedSourceRate: 24000 };
    });
    const rows = Object.fromEntries(measureRows(upsampled, DEFAULT_SPEC).map((r) => [r.key, r]));
    expect(rows.format.mark).toBe('warn');
    expect(rows.format.explanation).toMatch(/probably made at 24 kHz/);
    expect(rows.format.explanation).not.toMatch(/agree/);
    expect(rows.bandwidth.mark).toBe('pass');
    expect(rows.bandwidth.explanation).not.toMatch(/missing/);
  });

  it('names the dead track of a multitrack take on the Tracks row', () => {
    const eight = report((r) => {
      r.file = { ...r.file, channels: 8 };
      r.channels = Array.from({ length: 8 }, (_, i) => ({ ...r.channels[0], silent: i === 5 }));
      r.stereo = null;
    });
    const tracks = measureRows(eight, DEFAULT_SPEC).find((r) => r.key === 'stereo')!;
    expect(tracks.title).toBe('Tracks');
    expect(tracks.mark).toBe('fail');
    expect(tracks.explanation).toMatch(/carries no signal/);
    expect(tracks.explanation).not.toMatch(/two-channel/);
  });

  it('says an unused track of a location recording is unused, and still passes the Tracks row', () => {
    const poly = report((r) => {
      r.file = { ...r.file, channels: 4, layout: 'poly' };
      r.channels = Array.from({ length: 4 }, (_, i) => ({ ...r.channels[0], silent: i === 3 }));
      r.stereo = null;
    });
    const tracks = measureRows(poly, DEFAULT_SPEC).find((r) => r.key === 'stereo')!;
    expect(tracks.mark).toBe('pass');
    expect(tracks.explanation).toBe('3 of the 4 tracks carry signal; the others are unused.');
  });

  it('gives a clean take a pass on every applicable measure and n/a for a missing tone', () => {
    const marks = measureRows(report(), DEFAULT_SPEC).map((r) => [r.key, r.mark]);
    expect(marks).toEqual([
      ['format', 'pass'], ['peaks', 'pass'], ['loudness', 'pass'], ['noise', 'pass'], ['bandwidth', 'pass'],
      ['dc', 'pass'], ['stereo', 'pass'], ['dropouts', 'pass'], ['tone', 'none'],
    ]);
  });
});

describe('hearingCaution', () => {
  it('asks to lower the monitors for full-scale clipping or true peaks above 0 dBTP', () => {
    expect(hearingCaution(hot())).toMatch(/1 full-scale clipping event and true peaks up to 0\.4 dBTP/);
    const overOnly = report((r) => {
      r.peak.truePeakDbtp = 0.2;
    });
    expect(hearingCaution(overOnly)).toMatch(/true peaks up to 0\.2 dBTP/);
  });

  it('stays quiet for a take below full scale, even one flat-topped below it', () => {
    expect(hearingCaution(report())).toBeNull();
    const flat = report((r) => {
      r.clipping.events = [{ channel: 0, startSec: 1, endSec: 1.1, level: 'belowFullScale', levelDbfs: -3 }];
    });
    expect(hearingCaution(flat)).toBeNull();
    expect(hearingCaution(null)).toBeNull();
  });
});

describe('moving between findings', () => {
  const markers = [{ startSec: 1 }, { startSec: 4 }, { startSec: 6 }];
  it('finds the next and previous marker from a time', () => {
    expect(neighbourMarker(markers, 0, 1)).toBe(0);
    expect(neighbourMarker(markers, 1, 1)).toBe(1);
    expect(neighbourMarker(markers, 6, 1)).toBeNull();
    expect(neighbourMarker(markers, 6, -1)).toBe(1);
    expect(neighbourMarker(markers, 1, -1)).toBeNull();
    expect(neighbourMarker([], 3, 1)).toBeNull();
  });

  it('cues a second before, never before the start', () => {
    expect(cueTime(4)).toBe(3);
    expect(cueTime(0.4)).toBe(0);
  });

  it('shows a correlation that rounds to zero as 0.00, not -0.00', () => {
    const uncorrelated = report((r) => {
      r.stereo!.correlation = -0.0004;
    });
    expect(measureRows(uncorrelated, DEFAULT_SPEC).find((r) => r.key === 'stereo')!.value).toMatch(/^correlation 0\.00\b/);
    expect(formatMeasure(-0.04, 1, 'dB')).toBe('0.0 dB');
    expect(formatMeasure(-0.06, 1, 'dB')).toBe('-0.1 dB');
  });
});

describe('clock times', () => {
  it('formats and reads back m:ss.s', () => {
    expect(formatClock(134.04)).toBe('2:14.0');
    expect(formatClock(3725.5)).toBe('1:02:05.5');
    expect(parseClock('2:14')).toBe(134);
    expect(parseClock('0:02.5')).toBe(2.5);
    expect(parseClock('1:02:05')).toBe(3725);
    expect(parseClock('12.5')).toBe(12.5);
    expect(parseClock('2:75')).toBeNull();
    expect(parseClock('soon')).toBeNull();
    expect(parseClock('')).toBeNull();
  });
});
