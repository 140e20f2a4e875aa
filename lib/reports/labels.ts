import type { Decision, Verdict } from '@/models/Take';

/** Every status is a word with a mark beside it, never a colour alone. */
export const VERDICT_LABEL: Record<Verdict | 'none', { mark: string; word: string }> = {
  pass: { mark: '✓', word: 'Pass' },
  warn: { mark: '▲', word: 'Warn' },
  fail: { mark: '✕', word: 'Fail' },
  none: { mark: '○', word: 'Not measured' },
};

export const DECISION_LABEL: Record<Decision, { mark: string; word: string }> = {
  approved: { mark: '✓', word: 'Approved' },
  rejected: { mark: '✕', word: 'Rejected' },
  pending: { mark: '○', word: 'Pending' },
};

export const REPORT_CAUTION =
  "Takeproof's default thresholds are a starting point only: the studio's and the broadcaster's own delivery specs and local rules take precedence over them.";
