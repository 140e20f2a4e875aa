import type { Severity } from '@/dsp/types';
import type { Mark } from '@/lib/review/reportView';

// Colour always comes with a shape and a word.
export const SEVERITY = {
  fail: { shape: '✕', word: 'Fail', tone: 'text-fail' },
  warn: { shape: '▲', word: 'Warn', tone: 'text-warn' },
  info: { shape: '◆', word: 'Note', tone: 'text-accent' },
} as const;

export function SeverityMark({ severity }: { severity: Severity }) {
  const s = SEVERITY[severity];
  return (
    <span className={`inline-flex shrink-0 items-center gap-1 font-semibold ${s.tone}`}>
      <span aria-hidden="true">{s.shape}</span>
      {s.word}
    </span>
  );
}

const MARK = {
  pass: { shape: '✓', word: 'Pass', tone: 'text-pass' },
  warn: { shape: '▲', word: 'Warn', tone: 'text-warn' },
  fail: { shape: '✕', word: 'Fail', tone: 'text-fail' },
  none: { shape: '–', word: 'n/a', tone: 'text-muted' },
} as const;

export function MeasureMark({ mark }: { mark: Mark }) {
  const m = MARK[mark];
  return (
    <span className={`inline-flex w-16 shrink-0 items-center gap-1 font-semibold ${m.tone}`} data-mark={mark}>
      <span aria-hidden="true">{m.shape}</span>
      {m.word}
    </span>
  );
}
