import 'server-only';
import { QueryTypes } from 'sequelize';
import { MailDelivery, User } from '@/models';
import { db } from '@/lib/db/connection.server';
import { untilDatabaseAnswers } from '@/lib/db/availability.server';
import { loadReport } from '@/lib/reports/data.server';
import { composeReportMail } from '@/lib/reports/send.server';
import type { Actor } from '@/lib/auth/views';
import { jsonColumn } from '@/lib/db/jsonColumn';
import { deliveryPayload, handToMailServer, recordSent } from './deliveries.server';
import { mayWorkLater, plainMailError } from './transport.server';

/**
 * The outbox: report e-mails wait in `mail_deliveries` (status `queued`) and any worker sends them,
 * so a mail server outage or a web server restart loses none. A message the mail server could not
 * take for a passing reason is tried again after a wait that doubles each time; one it refused
 * outright, or one that kept failing, ends `failed` and can be sent again from the session page.
 */
const RETRY_BASE_SEC = Number(process.env.MAIL_RETRY_BASE_SEC ?? 30);
const RETRY_LONGEST_SEC = 30 * 60;
/** Tries before a message that keeps failing is given up on (about two hours with the default wait). */
export const MAIL_MAX_ATTEMPTS = 8;
/** A message left `sending` this long (its worker died mid-send) is claimed again. */
const STUCK_SENDING_MIN = 5;

export function mailRetryDelaySec(attempts: number): number {
  return Math.min(RETRY_LONGEST_SEC, RETRY_BASE_SEC * 2 ** Math.max(0, attempts - 1));
}

/** Claims the oldest report e-mail due to be sent; SKIP LOCKED lets several workers share the outbox. */
async function claimDue(): Promise<MailDelivery | null> {
  const sequelize = db();
  const id = await sequelize.transaction(async (transaction) => {
    const rows = await sequelize.query<{ id: number }>(
      `SELECT id FROM mail_deliveries
        WHERE kind = 'session_report'
          AND ((status = 'queued' AND (nextAttemptAt IS NULL OR nextAttemptAt <= NOW()))
            OR (status = 'sending' AND updatedAt < NOW() - INTERVAL :stuck MINUTE))
        ORDER BY id LIMIT 1 FOR UPDATE SKIP LOCKED`,
      { type: QueryTypes.SELECT, replacements: { stuck: STUCK_SENDING_MIN }, transaction },
    );
    if (!rows[0]) return null;
    await MailDelivery.update({ status: 'sending' }, { where: { id: rows[0].id }, transaction });
    return Number(rows[0].id);
  });
  return id === null ? null : MailDelivery.findByPk(id);
}

/** The person who asked for the report, as the report is rendered for them (their studio, their name). */
async function requester(delivery: MailDelivery): Promise<Actor> {
  const user = delivery.sentById ? await User.findByPk(delivery.sentById) : null;
  if (user) return { id: user.id, studioId: delivery.studioId, role: user.role, name: user.name, email: user.email };
  return { id: 0, studioId: delivery.studioId, role: 'manager', name: 'Takeproof', email: '' };
}

/** Sends the next due report e-mail, if any. Returns whether there was one. */
export async function sendNextQueuedMail(): Promise<boolean> {
  const delivery = await claimDue();
  if (!delivery) return false;
  const { sessionId, message } = deliveryPayload(delivery) as { sessionId: number; message?: string | null };
  let mail;
  try {
    const actor = await requester(delivery);
    mail = await composeReportMail(await loadReport(actor, Number(sessionId)), jsonColumn<string[]>(delivery.recipients), message ?? null, actor.name);
  } catch (error) {
    console.error(`Report e-mail ${delivery.id} could not be rendered:`, error);
    await delivery.update({ status: 'failed', attempts: delivery.attempts + 1, error: 'The report could not be prepared (the session may have been removed). Nothing was sent.' });
    return true;
  }
  const outcome = await handToMailServer(delivery, mail);
  // Once the mail server has the message, only the record is missing: wait for the database rather than send it twice.
  await untilDatabaseAnswers(`recording report e-mail ${delivery.id}`, async () => {
    if ('sent' in outcome) return recordSent(delivery, mail, outcome.sent);
    const attempts = delivery.attempts + 1;
    const error = plainMailError(outcome.failure);
    console.warn(`Report e-mail ${delivery.id}, try ${attempts}: ${(outcome.failure as Error).message ?? outcome.failure}`);
    if (mayWorkLater(outcome.failure) && attempts < MAIL_MAX_ATTEMPTS) {
      const nextAttemptAt = db().literal(`NOW() + INTERVAL ${Math.round(mailRetryDelaySec(attempts))} SECOND`) as unknown as Date;
      await delivery.update({ status: 'queued', attempts, error, nextAttemptAt });
    } else {
      await delivery.update({ status: 'failed', attempts, error, nextAttemptAt: null });
    }
  });
  return true;
}

/** Puts a failed (or stuck) report e-mail back in the outbox, to be sent at once. */
export async function queueAgain(delivery: MailDelivery): Promise<void> {
  await delivery.update({ status: 'queued', nextAttemptAt: null });
}
