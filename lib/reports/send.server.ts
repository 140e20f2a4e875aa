import 'server-only';
import { audit } from '@/lib/audit/record.server';
import { db } from '@/lib/db/connection.server';
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

/**
 * Records and audits a session report and puts it in the outbox (MariaDB), from which a worker sends
 * it; the delivery's status says where it stands (queued, sending, sent, failed).
 */
export async function sendSessionReport(actor: Actor, sessionId: number, input: SendReportInput): Promise<DeliveryView> {
  const data = await loadReport(actor, sessionId);
  const delivery = await db().transaction(async (transaction) => {
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
