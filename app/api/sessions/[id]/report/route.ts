import { requireActor } from '@/lib/auth/guard.server';
import { idParam, json, parseJson, route } from '@/lib/http/route.server';
import { sendReportSchema } from '@/lib/reports/schema';
import { listSessionReports, sendSessionReport } from '@/lib/reports/send.server';

type Context = { params: Promise<{ id: string }> };

/** The reports sent for this session, newest first. */
export const GET = route<Context>(async (_request, { params }) => {
  const actor = await requireActor('report:send');
  const id = await idParam(params, 'session');
  return json({ deliveries: await listSessionReports(actor, id) });
});

/** `{ to: string[], message?: string }` → 202 with the delivery (its status says whether the mail server took it). */
export const POST = route<Context>(async (request, { params }) => {
  const actor = await requireActor('report:send');
  const id = await idParam(params, 'session');
  const input = await parseJson(request, sendReportSchema);
  const delivery = await sendSessionReport(actor, id, input);
  // One object is answered bare; `delivery` is kept for the clients that read it there.
  return json({ ...delivery, delivery }, 202);
});
