import { requireActor } from '@/lib/auth/guard.server';
import { idParam, route, send } from '@/lib/http/route.server';
import { reportFile } from '@/lib/reports/download.server';

type Context = { params: Promise<{ id: string }> };

export const GET = route<Context>(async (_request, { params }) => {
  const actor = await requireActor('session:view');
  const id = await idParam(params, 'session');
  return send(await reportFile(actor, id, 'pdf'));
});
