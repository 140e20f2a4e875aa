import 'server-only';
import type { Transaction } from 'sequelize';
import { MailDelivery, User } from '@/models';
import type { MailKind } from '@/models/MailDelivery';
import { db } from '@/lib/db/connection.server';
import { env } from '@/lib/env.server';
import { AppError } from '@/lib/errors';
import { mailTransport, plainMailError, type OutgoingMail } from './transport.server';
import type { Actor } from '@/lib/auth/views';
import type { DeliveryView } from './views';
import { jsonColumn } from '@/lib/db/jsonColumn';

export function deliveryPayload(delivery: MailDelivery): Record<string, unknown> {
  return jsonColumn<Record<string, unknown> | null>(delivery.payload) ?? {};
}

export function toDeliveryView(d: MailDelivery & { sentBy?: { name: string } | null }): DeliveryView {
  return {
    id: d.id,
    kind: d.kind,
    recipients: jsonColumn<string[]>(d.recipients),
    subject: d.subject,
    status: d.status,
    messageId: d.messageId,
    error: d.error,
    attempts: d.attempts,
    sentBy: d.sentBy?.name ?? null,
    sentAt: d.sentAt ? d.sentAt.toISOString() : null,
    nextAttemptAt: d.status === 'queued' && d.nextAttemptAt ? d.nextAttemptAt.toISOString() : null,
    createdAt: d.createdAt.toISOString(),
  };
}

/** Records an e-mail about to be sent (inside the caller's transaction, next to its audit event). */
export async function createDelivery(
  actor: Actor,
  fields: { kind: MailKind; subject: { type: string; id: number | null }; recipients: string[]; title: string; payload: Record<string, unknown> },
  transaction?: Transaction,
): Promise<MailDelivery> {
  return MailDelivery.create(
    {
      studioId: actor.studioId,
      sentById: actor.id,
      kind: fields.kind,
      subjectType: fields.subject.type,
      subjectId: fields.subject.id,
      recipients: fields.recipients,
      subject: fields.title,
      payload: fields.payload,
      // A report waits in the outbox for a worker; an invitation is sent at once by the request itself.
      status: fields.kind === 'session_report' ? 'queued' : 'sending',
      messageId: null,
      error: null,
      sentAt: null,
    },
    { transaction },
  );
}

/** Hands the message to the SMTP server at once and stores how that went; never throws for a mail failure. */
export async function attemptDelivery(delivery: MailDelivery, mail: OutgoingMail): Promise<DeliveryView> {
  const outcome = await handToMailServer(delivery, mail);
  if ('failure' in outcome) await delivery.update({ status: 'failed', attempts: delivery.attempts + 1, error: plainMailError(outcome.failure) });
  else await recordSent(delivery, mail, outcome.sent);
  return getDelivery(delivery.studioId, delivery.id);
}

type SentInfo = { messageId?: string; rejected?: unknown[] };

/** Sends the message; the transport's error comes back instead of being thrown. */
export async function handToMailServer(delivery: MailDelivery, mail: OutgoingMail): Promise<{ sent: SentInfo } | { failure: unknown }> {
  try {
    const sent: SentInfo = await mailTransport().sendMail({
      from: env().MAIL_FROM,
      to: mail.to,
      subject: mail.subject,
      text: mail.text,
      html: mail.html,
      attachments: mail.attachments,
      // Lets the local outbox show each studio only its own mail.
      headers: { 'X-Takeproof-Studio': String(delivery.studioId) },
    });
    return { sent };
  } catch (failure) {
    return { failure };
  }
}

/** Stores that the mail server took the message (and which recipients it refused, if some). */
export async function recordSent(delivery: MailDelivery, mail: OutgoingMail, info: SentInfo): Promise<void> {
  const refused = (info.rejected ?? []).map(String);
  await delivery.update({
    status: 'sent',
    attempts: delivery.attempts + 1,
    messageId: info.messageId ?? null,
    sentAt: new Date(),
    nextAttemptAt: null,
    subject: mail.subject,
    error: refused.length ? `The mail server refused: ${refused.join(', ')}. The others received it.` : null,
  });
}

export async function getDelivery(studioId: number, id: number): Promise<DeliveryView> {
  const d = await MailDelivery.findOne({ where: { id, studioId }, include: [{ model: User, as: 'sentBy', attributes: ['name'] }] });
  if (!d) throw new AppError('not_found:delivery');
  return toDeliveryView(d);
}

/** Loads a delivery of the actor's studio; 404 for one that is missing or another studio's. */
export async function findDelivery(actor: Actor, id: number): Promise<MailDelivery> {
  db();
  const d = await MailDelivery.findOne({ where: { id, studioId: actor.studioId } });
  if (!d) throw new AppError('not_found:delivery', 'This e-mail does not exist, or belongs to another studio.');
  return d;
}

/** The studio's outgoing e-mail, newest first: queued, being sent, sent and failed. */
export async function listStudioDeliveries(actor: Actor, limit = 200): Promise<DeliveryView[]> {
  db();
  const rows = await MailDelivery.findAll({
    where: { studioId: actor.studioId },
    include: [{ model: User, as: 'sentBy', attributes: ['name'] }],
    order: [['createdAt', 'DESC'], ['id', 'DESC']],
    limit,
  });
  return rows.map(toDeliveryView);
}

/** The e-mails sent about one object, newest first. */
export async function listDeliveries(actor: Actor, subject: { type: string; id: number }, limit = 20): Promise<DeliveryView[]> {
  db();
  const rows = await MailDelivery.findAll({
    where: { studioId: actor.studioId, subjectType: subject.type, subjectId: subject.id },
    include: [{ model: User, as: 'sentBy', attributes: ['name'] }],
    order: [['createdAt', 'DESC'], ['id', 'DESC']],
    limit,
  });
  return rows.map(toDeliveryView);
}
