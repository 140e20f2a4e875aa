import 'server-only';
import { Op, type Transaction } from 'sequelize';
import { retryAfterSec, type Allowance } from '@/lib/auth/attemptLimiter';
import { audit } from '@/lib/audit/record.server';
import { db } from '@/lib/db/connection.server';
import { AppError } from '@/lib/errors';
import { MailDelivery, Studio } from '@/models';
import { createDelivery, getDelivery, listDeliveries } from '@/lib/mail/deliveries.server';
import { findSession } from '@/lib/sessions/service.server';
import type { OutgoingMail } from '@/lib/mail/transport.server';
import type { SendReportInput } from './schema';
import { takesCsv } from './csv';
import { reportHtml, reportText } from './html';
import { reportPdf } from './pdf.server';
import { loadReport } from './data.server';
import type { Actor } from '@/lib/auth/views';
import type { DeliveryView } from '@/lib/mail/views';
import { reportFileBase } from './content';
import type { ReportData } from './content';

export function reportSubject(data: ReportData): string {
  return `Session report: ${data.session.title}`.replace(/[\r\n]+/g, ' ').slice(0, 250);
}

/** The report e-mail with its PDF and CSV attachments, rendered from the session as it stands now. */
export async function composeReportMail(data: ReportData, to: string[], message: string | null, sender: string): Promise<OutgoingMail> {
  const base = reportFileBase(data);
  return {
    to,
    subject: reportSubject(data),
    html: reportHtml(data, message, sender),
    text: reportText(data, message, sender),
    attachments: [
      { filename: `${base}.pdf`, content: await reportPdf(data), contentType: 'application/pdf' },
      { filename: `${base}.csv`, content: takesCsv(data.takes), contentType: 'text/csv; charset=utf-8' },
    ],
  };
}

/** The reports sent for a session, newest first. */
export async function listSessionReports(actor: Actor, sessionId: number): Promise<DeliveryView[]> {
  await findSession(actor, sessionId);
  return listDeliveries(actor, { type: 'session', id: sessionId });
}

const HOUR_MS = 60 * 60 * 1000;
// Project defaults: reports sent per hour by one person and by a whole studio.
const PER_PERSON: Allowance = { max: Number(process.env.REPORT_SENDS_PER_PERSON_PER_HOUR ?? 20), windowMs: HOUR_MS };
const PER_STUDIO: Allowance = { max: Number(process.env.REPORT_SENDS_PER_STUDIO_PER_HOUR ?? 60), windowMs: HOUR_MS };

/**
 * Refuses with 429 once the person or the studio has sent its allowance of reports in the last
 * hour, so a signed-in account cannot be used to mail studio data out in bulk. Counts the reports
 * kept in the database; the caller holds the studio's row lock, so two sends cannot both pass.
 */
async function assertMaySendReport(actor: Actor, transaction: Transaction): Promise<void> {
  const now = Date.now();
  const sent = await MailDelivery.findAll({
    where: { studioId: actor.studioId, kind: 'session_report', createdAt: { [Op.gt]: new Date(now - HOUR_MS) } },
    attributes: ['sentById', 'createdAt'],
    transaction,
  });
  const times = (mine: boolean) => sent.filter((d) => !mine || d.sentById === actor.id).map((d) => d.createdAt.getTime());
  const personWait = retryAfterSec(times(true), PER_PERSON, now);
  const studioWait = retryAfterSec(times(false), PER_STUDIO, now);
  const wait = Math.max(personWait, studioWait);
  if (wait === 0) return;
  const who = personWait >= studioWait ? `You have sent ${PER_PERSON.max} reports` : `Your studio has sent ${PER_STUDIO.max} reports`;
  throw new AppError('rate_limited:report_send', `${who} in the last hour, the most Takeproof sends. Try again in ${Math.ceil(wait / 60)} minute(s).`, {
    extra: { retryAfterSec: wait },
  });
}

/**
 * Records and audits a session report and puts it in the outbox (MariaDB), from which a worker sends
 * it; the delivery's status says where it stands (queued, sending, sent, failed).
 */
export async function sendSessionReport(actor: Actor, sessionId: number, input: SendReportInput): Promise<DeliveryView> {
  const data = await loadReport(actor, sessionId);
  const delivery = await db().transaction(async (transaction) => {
    await Studio.findByPk(actor.studioId, { transaction, lock: transaction.LOCK.UPDATE });
    await assertMaySendReport(actor, transaction);
    const d = await createDelivery(
      actor,
      { kind: 'session_report', subject: { type: 'session', id: sessionId }, recipients: input.to, title: reportSubject(data), payload: { sessionId, message: input.message } },
      transaction,
    );
    await audit(actor, 'session.report_send', { type: 'session', id: sessionId }, { deliveryId: d.id, recipients: input.to }, transaction);
    return d;
  });
  return getDelivery(actor.studioId, delivery.id);
}
