import type { TakeSummary } from '@/lib/takes/views';
import { MEASURE, labelWithUnit } from '@/lib/glossary';
import { DECISION_STATUS, VERDICT_STATUS } from '@/lib/status';

type Cell = string | number | null;

/**
 * One CSV field (RFC 4180). Text that a spreadsheet would run as a formula
 * (starting with = + - @, tab or carriage return) gets a leading apostrophe.
 */
export function csvField(value: Cell): string {
  if (value == null) return '';
  let text = typeof value === 'number' ? (Number.isFinite(value) ? String(value) : '') : value;
  if (typeof value === 'string' && /^[=+\-@\t\r]/.test(text)) text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function csvRow(cells: Cell[]): string {
  return cells.map(csvField).join(',');
}

export const CSV_HEADER = [
  'Take',
  labelWithUnit('sampleRate'),
  MEASURE.bitDepth.label,
  MEASURE.channels.label,
  labelWithUnit('duration'),
  MEASURE.effectiveBits.label,
  labelWithUnit('truePeak'),
  labelWithUnit('integratedLoudness'),
  labelWithUnit('noiseFloor'),
  MEASURE.clipEvents.label,
  'Verdict',
  'Reason',
  'Decision',
  'Decided by',
  'Note',
];

const round = (v: number | null, decimals: number) => (v == null || !Number.isFinite(v) ? null : Number(v.toFixed(decimals)));

/** The take table as CSV, CRLF line ends, with a UTF-8 byte order mark so spreadsheets read accents right. */
export function takesCsv(takes: TakeSummary[]): string {
  const lines = [csvRow(CSV_HEADER)];
  for (const t of takes) {
    lines.push(
      csvRow([
        t.originalName,
        t.format.sampleRate,
        t.format.bitsPerSample,
        t.format.channels,
        round(t.durationSec, 2),
        t.effectiveBits,
        round(t.truePeakDbtp, 1),
        round(t.integratedLufs, 1),
        round(t.noiseFloorDbfs, 1),
        t.clipEvents,
        VERDICT_STATUS[t.verdict ?? 'none'].word,
        t.reason,
        DECISION_STATUS[t.decision].word,
        t.decidedBy,
        t.decisionNote,
      ]),
    );
  }
  return `\ufeff${lines.join('\r\n')}\r\n`;
}
