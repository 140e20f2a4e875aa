import { requireActor } from '@/lib/auth/guard.server';
import { listAuditEvents } from '@/lib/audit/log.server';
import { json, route } from '@/lib/http/route.server';
import { auditQuerySchema } from '@/lib/audit/schema';

/** `?action=&actorId=&subjectType=&from=YYYY-MM-DD&to=YYYY-MM-DD&page=` → newest first, 50 a page. */
export const GET = route(async (request) => {
  const actor = await requireActor('audit:view');
  const query = auditQuerySchema.parse(Object.fromEntries(new URL(request.url).searchParams));
  return json(await listAuditEvents(actor, query));
});
