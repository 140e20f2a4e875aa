import 'server-only';
import { env } from '@/lib/env.server';
import { getSession } from '@/lib/sessions/service.server';
import { studioName } from '@/lib/studio/studio.server';
import { listSessionTakes } from '@/lib/takes/service.server';
import type { ReportData } from './content';
import type { Actor } from '@/lib/auth/views';

/** Everything a session report shows, read once for the e-mail, the PDF and the CSV alike. */
export async function loadReport(actor: Actor, sessionId: number): Promise<ReportData> {
  const session = await getSession(actor, sessionId);
  const takes = await listSessionTakes(actor, sessionId);
  const counts: ReportData['counts'] = { verdict: { pass: 0, warn: 0, fail: 0, none: 0 }, decision: { approved: 0, rejected: 0, pending: 0 } };
  for (const t of takes) {
    counts.verdict[t.verdict ?? 'none']++;
    counts.decision[t.decision]++;
  }
  const sessionUrl = `${env().NEXTAUTH_URL.replace(/\/+$/, '')}/sessions/${session.id}`;
  return { studio: await studioName(actor), session, takes, counts, generatedAt: new Date(), sessionUrl };
}
