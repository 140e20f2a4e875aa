/**
 * What the take review page shows, worked out from a stored report: the marks
 * on the waveform, the measures with their pass/warn/fail mark, the hearing
 * caution. Pure and safe to import from the browser.
 */
import type { DeliverySpec } from '@/dsp/spec';
import type { AnalysisReport, Finding, Severity } from '@/dsp/types';
import { channelName, channelShortName, formatClock, formatKhz, formatMeasure, plural } from '@/lib/format';

export type Mark = 'pass' | 'warn' | 'fail' | 'none';

/** A stretch of the take worth hearing: one region on the waveform and one line in the findings list. */
export interface TimedMarker {
  id: string;
  kind: 'clip' | 'flat-top' | 'dropout' | 'tone' | 'finding';
  check: Finding['check'];
  severity: Severity;
  startSec: number;
  endSec: number;
  channel: number | null;
  /** A few words drawn on the region. */
  label: string;
  /** The sentence in the findings list. */
  message: string;
}

/** Clip events drawn one by one before the rest are left to the findings text. */
export const MAX_CLIP_MARKERS = 200;
/** Shortest region drawn, so a one-sample clip stays visible and clickable. */
const MIN_REGION_SEC = 0.02;

function severityOf(findings: Finding[], check: Finding['check'], channel?: number, fallback: Severity = 'warn'): Severity {
  const own = findings.filter((f) => f.check === check && (channel === undefined || f.channel === undefined || f.channel === channel));
  return worst(own.map((f) => f.severity)) ?? fallback;
}

function worst(severities: Severity[]): Severity | null {
  if (severities.includes('fail')) return 'fail';
  if (severities.includes('warn')) return 'warn';
  if (severities.includes('info')) return 'info';
  return null;
}

/** Every stretch of the take the report places in time, in time order. */
export function timedMarkers(report: AnalysisReport): TimedMarker[] {
  const markers: TimedMarker[] = [];
  const channels = report.file.channels;
  const widen = (start: number, end: number) => (end - start < MIN_REGION_SEC ? { startSec: start, endSec: start + MIN_REGION_SEC } : { startSec: start, endSec: end });

  report.clipping.events.slice(0, MAX_CLIP_MARKERS).forEach((event, i) => {
    const flat = event.level === 'belowFullScale';
    const ch = channelShortName(event.channel, channels);
    markers.push({
      id: `clip-${i}`,
      kind: flat ? 'flat-top' : 'clip',
      check: 'clipping',
      severity: severityOf(report.findings, 'clipping', event.channel),
      ...widen(event.startSec, event.endSec),
      channel: event.channel,
      label: `${flat ? 'Flat top' : 'Clip'} ${ch}`.trim(),
      message: flat
        ? `Flat-topped at ${event.levelDbfs.toFixed(1)} dBFS on the ${channelName(event.channel, channels)}: something before the converter clipped.`
        : `Clipped at full scale on the ${channelName(event.channel, channels)}.`,
    });
  });

  report.dropouts.forEach((gap, i) => {
    markers.push({
      id: `dropout-${i}`,
      kind: 'dropout',
      check: 'dropout',
      severity: severityOf(report.findings, 'dropout'),
      ...widen(gap.startSec, gap.endSec),
      channel: null,
      label: 'Dropout',
      message: `Digital silence for ${Math.round((gap.endSec - gap.startSec) * 1000)} ms inside the take.`,
    });
  });

  if (report.tone) {
    const t = report.tone;
    markers.push({
      id: 'tone',
      kind: 'tone',
      check: 'tone',
      severity: 'info',
      ...widen(t.startSec, t.endSec),
      channel: null,
      label: 'Line-up tone',
      message: `Line-up tone, ${t.frequencyHz.toFixed(1)} Hz at ${t.levelDbfs.toFixed(1)} dBFS.`,
    });
  }

  // Timed findings the lists above do not already cover (e.g. a tone that reads at the wrong rate).
  report.findings.forEach((f, i) => {
    if (f.startSec == null) return;
    if (f.check === 'clipping' || f.check === 'dropout' || f.check === 'tone') return;
    markers.push({
      id: `finding-${i}`,
      kind: 'finding',
      check: f.check,
      severity: f.severity,
      ...widen(f.startSec, f.endSec ?? f.startSec),
      channel: f.channel ?? null,
      label: CHECK_LABEL[f.check],
      message: f.message,
    });
  });

  return markers.sort((a, b) => a.startSec - b.startSec || a.id.localeCompare(b.id));
}

export const CHECK_LABEL: Record<Finding['check'], string> = {
  container: 'File structure',
  format: 'Format',
  resolution: 'Bit depth',
  clipping: 'Clipping',
  'true-peak': 'True peak',
  loudness: 'Loudness',
  'noise-floor': 'Noise floor',
  hum: 'Hum',
  bandwidth: 'Bandwidth',
  aliasing: 'Aliasing',
  'dc-offset': 'DC offset',
  dropout: 'Dropout',
  'silent-channel': 'Silent channel',
  stereo: 'Stereo',
  tone: 'Line-up tone',
  'sample-rate': 'Sample rate',
  'non-finite': 'Invalid samples',
  'over-full-scale': 'Over full scale',
};

/** The index of the marker to move to from `time` (arrow keys): the next one after it, or the one before. */
export function neighbourMarker(markers: readonly { startSec: number }[], time: number, direction: 1 | -1): number | null {
  if (markers.length === 0) return null;
  const epsilon = 0.05;
  if (direction === 1) {
    const i = markers.findIndex((m) => m.startSec > time + epsilon);
    return i < 0 ? null : i;
  }
  for (let i = markers.length - 1; i >= 0; i--) if (markers[i].startSec < time - epsilon) return i;
  return null;
}

/**
 * The marker the arrow keys move to: the next or previous one in the list while the playhead is
 * still on the selected one (so markers at the same moment are each reached in turn), else the
 * neighbour of the playhead's time.
 */
export function stepMarker(markers: readonly { startSec: number; endSec: number }[], selected: number | null, time: number, direction: 1 | -1): number | null {
  const current = selected !== null ? markers[selected] : undefined;
  const onCurrent = current !== undefined && time >= cueTime(current.startSec) - 0.1 && time <= current.endSec + 0.5;
  if (!onCurrent) return neighbourMarker(markers, time, direction);
  const next = selected! + direction;
  return next >= 0 && next < markers.length ? next : null;
}

/** Playback from this many seconds before a marker, so the ear hears what leads into it. */
export const PRE_ROLL_SEC = 1;
export const cueTime = (startSec: number) => Math.max(0, startSec - PRE_ROLL_SEC);

/** Why the monitors should come down before playing, or null when nothing in the take calls for it. */
export function hearingCaution(report: AnalysisReport | null): string | null {
  if (!report) return null;
  const fullScaleClips = report.clipping.events.filter((e) => e.level === 'fullScale').length;
  const tp = report.peak.truePeakDbtp;
  const reasons: string[] = [];
  if (fullScaleClips > 0) reasons.push(plural(fullScaleClips, 'full-scale clipping event'));
  if (tp !== null && tp > 0) reasons.push(`true peaks up to ${tp.toFixed(1)} dBTP`);
  if (!reasons.length) return null;
  return `This take has ${reasons.join(' and ')}. Lower your monitor level before you press play.`;
}

export interface MeasureRow {
  key: string;
  title: string;
  /** The measured values, short. */
  value: string;
  mark: Mark;
  /** One plain sentence on what the value means for the edit. */
  explanation: string;
  /** The findings behind the mark, in full. */
  findings: Finding[];
}

function markOf(findings: Finding[]): Mark {
  const w = worst(findings.map((f) => f.severity));
  return w === 'fail' ? 'fail' : w === 'warn' ? 'warn' : 'pass';
}

/** The measures panel: one row per aspect of the take, each marked from the findings of its checks. */
export function measureRows(report: AnalysisReport, spec: DeliverySpec): MeasureRow[] {
  const f = report.findings;
  const pick = (...checks: Finding['check'][]) => f.filter((x) => checks.includes(x.check));
  const file = report.file;
  const rows: MeasureRow[] = [];
  // The sentence says what this row's own findings found; only a row without a warning or failure
  // explains the measure in its own words.
  const add = (row: Omit<MeasureRow, 'mark'> & { mark?: Mark }) => {
    const problems = row.findings.filter((x) => x.severity !== 'info');
    rows.push({ ...row, mark: row.mark ?? markOf(row.findings), explanation: problems.length ? problems.map((x) => x.message).join(' ') : row.explanation });
  };

  const declared = file.encoding === 'float' ? `${file.bitsPerSample}-bit float` : `${file.bitsPerSample}-bit`;
  const used = report.resolution.effectiveBits;
  const formatFindings = pick('container', 'format', 'resolution', 'sample-rate');
  add({
    key: 'format',
    title: 'Format',
    value: `${declared} file, ${used > 0 ? `${used} bits used` : 'no audio bits used'} · ${formatKhz(file.sampleRate)} · ${file.channels === 1 ? 'mono' : file.channels === 2 ? 'stereo' : `${file.channels} channels`} · ${file.container}`,
    findings: formatFindings,
    explanation:
      used > 0 && used < file.bitsPerSample && file.encoding === 'pcm'
        ? `The file has room for ${file.bitsPerSample} bits and the audio uses ${used}, which the delivery spec accepts.`
        : 'The file’s declared format and the resolution its audio really uses agree.',
  });

  const clipCount = report.clipping.events.length;
  add({
    key: 'peaks',
    title: 'Peaks and clipping',
    value: `sample peak ${formatMeasure(report.peak.samplePeakDbfs, 1, 'dBFS')} · true peak ${formatMeasure(report.peak.truePeakDbtp, 1, 'dBTP')} (limit ${formatMeasure(spec.maxTruePeakDbtp, 1, 'dBTP')}) · ${plural(clipCount, 'clipping event')}`,
    findings: pick('clipping', 'true-peak'),
    explanation:
      clipCount > 0
        ? 'Clipped stretches are distorted for good: they cannot be repaired by turning the level down in the edit.'
        : 'True peak estimates the loudest point after conversion; above the limit it may distort on playback or encoding.',
  });

  const lufs = report.loudness.integratedLufs;
  add({
    key: 'loudness',
    title: 'Loudness',
    value: `${formatMeasure(lufs, 1, 'LUFS')} integrated (target ${formatMeasure(spec.loudnessTargetLufs, 1, 'LUFS')} ± ${spec.loudnessToleranceLu} LU) · range ${formatMeasure(report.loudness.rangeLu, 1, 'LU')} · short-term max ${formatMeasure(report.loudness.shortTermMaxLufs, 1, 'LUFS')}`,
    findings: pick('loudness'),
    explanation:
      lufs == null
        ? 'The take is too short or too quiet for an overall loudness reading.'
        : `The take’s overall loudness is ${Math.abs(lufs - spec.loudnessTargetLufs).toFixed(1)} LU ${lufs > spec.loudnessTargetLufs ? 'above' : 'below'} the delivery target; a raw take is usually levelled in the edit.`,
  });

  const floor = report.noise.floorDbfs;
  add({
    key: 'noise',
    title: 'Noise floor and hum',
    value:
      floor == null
        ? 'not measurable: no quiet passage'
        : `${formatMeasure(floor, 1, 'dBFS')} in the quiet passages (limit ${formatMeasure(spec.maxNoiseFloorDbfs, 0, 'dBFS')}) · ${report.noise.humHz ? `hum at ${report.noise.humHz} Hz` : 'no mains hum'}`,
    findings: pick('noise-floor', 'hum'),
    // Nothing measured, nothing judged: the row says so instead of showing a pass.
    mark: floor == null ? 'none' : undefined,
    explanation:
      floor == null
        ? 'The take never falls well below its programme, so its noise floor and hum cannot be measured here.'
        : report.noise.humHz
          ? 'A steady mains hum sits under the quiet passages; it usually comes from a ground loop or a nearby power cable.'
          : 'The noise floor is the hiss heard between words; the lower it is, the cleaner the pauses.',
  });

  const bw = report.bandwidth;
  add({
    key: 'bandwidth',
    title: 'Bandwidth',
    value: `${bw.effectiveHz != null ? `audio up to ${formatKhz(bw.effectiveHz)}` : '—'} of ${formatKhz(file.sampleRate / 2)} possible${bw.impliedSourceRate ? ` · probably made at ${formatKhz(bw.impliedSourceRate)}` : ''}${bw.aliasingRisk ? ' · aliasing risk' : ''}`,
    findings: pick('bandwidth', 'aliasing'),
    explanation: bw.impliedSourceRate
      ? 'The band limit points to a take made at a lower sample rate; the Format row judges that.'
      : 'How high the recorded frequencies reach; this take’s reach is within what the delivery spec accepts.',
  });

  const worstDc = report.channels.reduce((m, c) => (Math.abs(c.dcOffset) > Math.abs(m) ? c.dcOffset : m), 0);
  add({
    key: 'dc',
    title: 'DC offset',
    value: `${(Math.abs(worstDc) * 100).toPrecision(2)} % of full scale at most (limit ${(spec.maxDcOffset * 100).toPrecision(2)} %)`,
    findings: pick('dc-offset'),
    explanation: 'A DC offset shifts the whole waveform off centre; it wastes headroom and can click at edits.',
  });

  if (report.stereo) {
    const s = report.stereo;
    add({
      key: 'stereo',
      title: 'Stereo',
      value: `correlation ${formatMeasure(s.correlation, 2)}${s.identicalChannels ? ' · both channels identical' : ''}${s.polarityInverted ? ' · polarity inverted' : ''}${s.antiPhaseShare != null ? ` · ${Math.round(s.antiPhaseShare * 100)} % in anti-phase` : ''}`,
      findings: pick('stereo', 'silent-channel'),
      explanation: s.polarityInverted
        ? 'One channel is upside down relative to the other, so the take will cancel out when played in mono.'
        : 'Correlation near +1 means the channels agree; near −1 means they cancel each other when summed to mono.',
    });
  } else {
    const silentTracks = report.channels.filter((c) => c.silent).length;
    add({
      key: 'stereo',
      title: file.channels === 1 ? 'Channel' : 'Tracks',
      value: file.channels === 1 ? 'mono take' : `${file.channels} tracks`,
      findings: pick('silent-channel'),
      explanation:
        file.channels === 1
          ? 'The channel carries signal.'
          : silentTracks > 0
            ? `${file.channels - silentTracks} of the ${file.channels} tracks carry signal; the others are unused.`
            : `Each of the ${file.channels} tracks carries signal of its own.`,
    });
  }

  const dropoutCount = report.dropoutCount ?? report.dropouts.length;
  add({
    key: 'dropouts',
    title: 'Dropouts',
    value: plural(dropoutCount, 'dropout'),
    findings: pick('dropout'),
    explanation: dropoutCount ? 'Short stretches of digital silence inside the audio, usually a cable, card or buffer fault during recording.' : 'No stretch of digital silence interrupts the audio.',
  });

  const tone = report.tone;
  add({
    key: 'tone',
    title: 'Line-up tone',
    value: tone ? `${tone.frequencyHz.toFixed(1)} Hz at ${tone.levelDbfs.toFixed(1)} dBFS, ${formatClock(tone.startSec)}–${formatClock(tone.endSec)} · SINAD ${tone.sinadDb.toFixed(1)} dB` : 'none found',
    findings: pick('tone'),
    mark: tone ? undefined : 'none',
    explanation: tone
      ? 'The reference tone at the head of the take shows the recorder’s level and how cleanly it converts.'
      : 'No reference tone was found at the head or tail of the take; that is fine unless the delivery asks for one.',
  });

  return rows;
}

/** Findings without a place in time, for the list under the timed ones. */
export function untimedFindings(report: AnalysisReport): Finding[] {
  return report.findings.filter((f) => f.startSec == null);
}

