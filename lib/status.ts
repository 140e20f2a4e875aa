/**
 * Takeproof's one status vocabulary: the word, the mark (a shape, so status never depends on
 * colour) and the tone of every status a page, the PDF, the CSV or an e-mail shows. Each mark
 * means one thing within the product; pages, reports and e-mail read this table and never spell
 * a status themselves. Safe to import from the browser.
 */
import type { MailStatus } from '@/models/MailDelivery';
import type { Decision, TakeStatus, Verdict } from '@/models/Take';

/** Shapes, drawn as these characters on pages and in e-mail, and as vector shapes in the PDF. */
export const SHAPE_MARK = {
  check: '✓',
  triangle: '▲',
  cross: '✕',
  dottedRing: '◌',
  dot: '●',
  square: '■',
  ring: '○',
  clock: '◷',
  halfCircle: '◐',
  diamond: '◆',
  hollowDiamond: '◇',
  circledCross: '⊗',
  play: '▶',
  hollowSquare: '□',
  star: '★',
  hollowStar: '☆',
  slashedRing: '⊘',
  hollowTriangle: '△',
  downTriangle: '▼',
  hollowDownTriangle: '▽',
  emDash: '—',
  envelope: '✉',
  squaredCross: '⊠',
} as const;
export type Shape = keyof typeof SHAPE_MARK;

/** How strongly a status asks for attention; each page, the PDF and e-mail map it to their own colours. */
export type Tone = 'pass' | 'warn' | 'fail' | 'muted' | 'accent';

export interface StatusLook {
  word: string;
  shape: Shape;
  mark: string;
  tone: Tone;
}

const look = (word: string, shape: Shape, tone: Tone): StatusLook => ({ word, shape, mark: SHAPE_MARK[shape], tone });

/** The measurement engine's judgement of a take. */
export const VERDICT_STATUS: Record<Verdict | 'none', StatusLook> = {
  fail: look('Fail', 'cross', 'fail'),
  warn: look('Warn', 'triangle', 'warn'),
  pass: look('Pass', 'check', 'pass'),
  none: look('Not measured', 'dottedRing', 'muted'),
};

/** The producer's decision on a take. */
export const DECISION_STATUS: Record<Decision, StatusLook> = {
  approved: look('Approved', 'dot', 'pass'),
  rejected: look('Rejected', 'square', 'fail'),
  pending: look('Pending', 'ring', 'muted'),
};

/** Where a take is in its measurement. The clock means waiting in the queue and the half circle work under way, for takes and e-mail alike. */
export const TAKE_STATUS: Record<TakeStatus, StatusLook> = {
  queued: look('Queued', 'clock', 'muted'),
  measuring: look('Measuring', 'halfCircle', 'accent'),
  measured: look('Measured', 'diamond', 'muted'),
  unreadable: look('Unreadable', 'circledCross', 'fail'),
};

/** A session, open for uploads or closed. */
export const SESSION_STATUS: Record<'open' | 'closed', StatusLook> = {
  open: look('Open', 'play', 'accent'),
  closed: look('Closed', 'hollowSquare', 'muted'),
};

/** A recorder of the studio's fleet. */
export const RECORDER_STATUS: Record<'active' | 'retired', StatusLook> = {
  active: look('In service', 'star', 'pass'),
  retired: look('Retired', 'hollowStar', 'muted'),
};

/** A member of the studio's team. */
export const MEMBER_STATUS: Record<'active' | 'invited' | 'deactivated', StatusLook> = {
  active: look('Active', 'hollowDiamond', 'pass'),
  invited: look('Invited', 'hollowTriangle', 'warn'),
  deactivated: look('Deactivated', 'slashedRing', 'muted'),
};

/** An e-mail Takeproof sends (a report, an invitation), from the outbox to the mail server. */
export const MAIL_STATUS: Record<MailStatus, StatusLook> = {
  queued: look('Queued', 'clock', 'muted'),
  sending: look('Sending', 'halfCircle', 'accent'),
  sent: look('Sent', 'envelope', 'pass'),
  failed: look('Not sent', 'squaredCross', 'fail'),
};

/** A fleet alert on a recorder, and a recorder without one. */
export const ALERT_STATUS: Record<'fail' | 'warn' | 'none', StatusLook> = {
  fail: look('Act now', 'downTriangle', 'fail'),
  warn: look('Check', 'hollowDownTriangle', 'warn'),
  none: look('None', 'emDash', 'muted'),
};

/** "✕ Fail": mark and word, for plain text (CSV cells keep the word alone). */
export function statusText(status: StatusLook): string {
  return `${status.mark} ${status.word}`;
}
