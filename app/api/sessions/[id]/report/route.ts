import { requireActor } from '@/lib/auth/guard.server';
import { idParam, json, parseJson, route } from '@/lib/http/route.server';
import { listDeliveries } from '@/lib/mail/deliveries.server';
import { sendSessionReport } from '@/lib/reports/send.server';
import { sendReportSchema } from '@/lib/reports/schema';
import { findSession } from '@/lib/sessions/service.server';

type Context = { params: Promise<{ id: string }> };

/** The reports sent for this session, newest first. */
export const GET = route<Context>(async (_request, { params }) => {
  const actor = await requireActor('report:send');
  const id = await idParam(params, 'session');
  await findSession(actor, id);
  return json({ deliveries: await listDeliveries(actor, { type: 'session', id }) });
});

/** `{ to: string[], message?: string }` → 202 with the delivery (its status says whether the mail server took it). */
export const POST = route<Context>(async (request, { params }) => {
  const actor = await requireActor('report:send');
  const id = await idParam(params, 'session');
  await findSession(actor, id);
  const input = await parseJson(request, sendReportSchema);
  return json({ delivery: await sendSessionReport(actor, id, input) }, 202);
});
