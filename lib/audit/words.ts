/**
 * The audit log in words: what each recorded action means, what kind of thing it touched, and its
 * details as a sentence. Stored audit rows keep their codes (DEVELOPERS.md, enum strings); only
 * what people read is worded here. Safe to import from the browser.
 */
import { ROLE_LABEL } from '@/lib/auth/policy';
import { formatBytes, formatClock } from '@/lib/format';
import { DECISION_STATUS } from '@/lib/status';
import type { Role } from '@/models/User';
import type { Decision } from '@/models/Take';

export const ACTION_WORDS: Record<string, string> = {
  'session.create': 'Created a session',
  'session.update': 'Changed a session',
  'session.report_send': 'Sent the session report',
  'take.upload': 'Uploaded a take',
  'take.remeasure': 'Asked for a take to be measured again',
  'take.replace': 'Replaced a take’s file',
  'take.remove': 'Removed a take',
  'take.decide': 'Decided on a take',
  'take.comment': 'Commented on a take',
  'spec.create': 'Created a delivery spec',
  'spec.update': 'Changed a delivery spec',
  'spec.duplicate': 'Copied a delivery spec',
  'recorder.create': 'Added a recorder',
  'recorder.update': 'Changed a recorder',
  'recorder.retire': 'Retired a recorder',
  'recorder.reinstate': 'Put a recorder back in service',
  'user.invite': 'Invited a person',
  'user.invite_resend': 'Sent an invitation again',
  'user.role_change': 'Changed a person’s role',
  'user.deactivate': 'Deactivated a person',
  'user.reactivate': 'Reactivated a person',
  'invitation.accept': 'Accepted an invitation',
  'account.password_change': 'Changed their own password',
  'user.password_reset_send': 'Sent a password reset link',
  'account.password_reset': 'Chose a new password from a reset link',
  'mail.retry': 'Sent an e-mail again',
};

export const SUBJECT_WORDS: Record<string, string> = {
  session: 'Session',
  take: 'Take',
  spec: 'Delivery spec',
  recorder: 'Recorder',
  user: 'Person',
};

/** An action's words; an action this table does not know yet reads as its code, spaced out. */
export function actionWords(action: string): string {
  return ACTION_WORDS[action] ?? action.replace(/[._]/g, ' ');
}

export function subjectWords(type: string): string {
  return SUBJECT_WORDS[type] ?? type;
}

// Field names as the forms label them.
const FIELD_WORDS: Record<string, string> = {
  title: 'title', client: 'show / client', recordedOn: 'recording date', room: 'room', engineerId: 'engineer', producerId: 'producer',
  deliverySpecId: 'delivery spec', notes: 'notes', status: 'status', name: 'name', description: 'description', thresholds: 'thresholds',
  archived: 'archived', label: 'label', makeModel: 'make and model', serial: 'serial', location: 'location', bextMatch: 'BWF match text', active: 'in service',
};

const fieldList = (fields: unknown) => (Array.isArray(fields) ? fields.map((f) => FIELD_WORDS[String(f)] ?? String(f)).join(', ') : '');
const roleWord = (role: unknown) => ROLE_LABEL[role as Role] ?? String(role);
const decisionWord = (decision: unknown) => DECISION_STATUS[decision as Decision]?.word ?? String(decision);

/** The details of an audit row as a sentence; internal references (ids, hashes) are left out. */
export function detailWords(action: string, detail: Record<string, unknown> | null): string {
  if (!detail) return '';
  const d = detail;
  const parts: string[] = [];
  if (typeof d.name === 'string' && action !== 'spec.create') parts.push(action === 'take.replace' ? `new file “${d.name}”` : `“${d.name}”`);
  if (typeof d.previousName === 'string') parts.push(`was “${d.previousName}”`);
  if (typeof d.bytes === 'number') parts.push(formatBytes(d.bytes));
  if (typeof d.title === 'string') parts.push(`“${d.title}”`);
  if (typeof d.label === 'string') parts.push(`“${d.label}”`);
  if (typeof d.email === 'string') parts.push(d.email);
  if (d.role && typeof d.role === 'object') parts.push(`role ${roleWord((d.role as { from: unknown }).from)} → ${roleWord((d.role as { to: unknown }).to)}`);
  else if (typeof d.role === 'string') parts.push(`as ${roleWord(d.role).toLowerCase()}`);
  if (typeof d.decision === 'string') parts.push(action === 'take.remove' ? `its decision was ${decisionWord(d.decision).toLowerCase()}` : decisionWord(d.decision));
  if (typeof d.previous === 'string') parts.push(`was ${decisionWord(d.previous).toLowerCase()}`);
  if (typeof d.note === 'string' && d.note) parts.push(`note “${d.note}”`);
  if (typeof d.atSec === 'number') parts.push(`at ${formatClock(d.atSec)}`);
  if (Array.isArray(d.fields) && d.fields.length) parts.push(`changed ${fieldList(d.fields)}`);
  if (Array.isArray(d.thresholds) && d.thresholds.length) parts.push(`thresholds changed: ${d.thresholds.join(', ')}`);
  if (Array.isArray(d.recipients)) parts.push(`to ${d.recipients.join(', ')}`);
  return parts.join(' · ');
}
