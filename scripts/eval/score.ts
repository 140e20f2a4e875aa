import type { AnalysisReport, Finding } from '../../dsp/types';
import type { EvalTake } from './corpus';

/**
 * How a report is scored against what was planted. On a clean take every warning or failure is a
 * false alarm, except those that only compare a correct measure with the delivery spec (loudness
 * against its target, a true peak under 0 dBTP against its limit, a real 16-bit take against the
 * minimum bits). A planted fault is found when a warning or failure of its check names the
 * right channel (where the fault has one) and touches the fault's time (±0.5 s, where both have one).
 */

const TIME_SLACK_SEC = 0.5;

export function isAlarm(finding: Finding): boolean {
  return finding.severity === 'warn' || finding.severity === 'fail';
}

/** A finding that only compares a correct measure with the spec. */
export function isSpecComparison(finding: Finding, report: AnalysisReport): boolean {
  if (finding.check === 'loudness') return true;
  if (finding.check === 'true-peak') return finding.severity === 'warn';
  if (finding.check === 'resolution') return report.resolution.effectiveBits === report.file.bitsPerSample || report.file.encoding === 'float';
  return false;
}

export function falseAlarms(report: AnalysisReport): Finding[] {
  return report.findings.filter((finding) => isAlarm(finding) && !isSpecComparison(finding, report));
}

/** The table row a finding belongs to. */
export function rowOf(finding: Finding, report: AnalysisReport): string {
  switch (finding.check) {
    case 'clipping':
      return finding.summary?.startsWith('Clipped at full scale') ? 'clipping at full scale' : 'clipping below full scale';
    case 'silent-channel':
      return finding.channel !== undefined && report.channels[finding.channel]?.silentKind === 'noise-only' ? 'dead channel (open-input hiss)' : 'dead channel (digital zero)';
    case 'true-peak': return 'true-peak over';
    case 'dropout': return 'dropout';
    case 'dc-offset': return 'DC offset';
    case 'stereo': return 'polarity inversion';
    case 'hum': return 'hum under speech';
    case 'bandwidth': return 'low bandwidth / upsampled';
    case 'sample-rate': return finding.message.includes('line-up tone') ? 'wrong declared rate (tone)' : 'low bandwidth / upsampled';
    case 'resolution': return '16-bit audio in a 24-bit file';
    case 'non-finite': return 'NaN / infinite samples';
    case 'over-full-scale': return 'float over full scale';
    case 'loudness': return 'loudness outside the target';
    case 'noise-floor': return 'noise floor';
    default: return finding.check;
  }
}

/** Whether the planted fault of `take` is among the report's findings, at the right channel and time. */
export function faultFound(take: EvalTake, report: AnalysisReport): boolean {
  const expected = take.expect!;
  return report.findings.some((finding) => {
    if (!isAlarm(finding) || !expected.checks.includes(finding.check)) return false;
    if (expected.channel !== undefined && finding.channel !== undefined && finding.channel !== expected.channel) return false;
    if (expected.channel !== undefined && finding.channel === undefined && report.file.channels > 1 && !['non-finite', 'dropout', 'stereo'].includes(finding.check)) return false;
    if (expected.fromSec !== undefined && finding.startSec !== undefined) {
      const end = finding.endSec ?? finding.startSec;
      if (finding.startSec > expected.toSec! + TIME_SLACK_SEC || end < expected.fromSec - TIME_SLACK_SEC) return false;
    }
    return true;
  });
}

/** Warnings and failures on a faulty take beyond the planted fault's own check (and spec comparisons). */
export function otherAlarms(take: EvalTake, report: AnalysisReport): Finding[] {
  return falseAlarms(report).filter((finding) => !take.expect!.checks.includes(finding.check));
}
