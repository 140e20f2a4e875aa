import { requireActor } from '@/lib/auth/guard.server';
import { listAuditEvents } from '@/lib/audit/log.server';
import { json, parseQuery, route } from '@/lib/http/route.server';
import { auditQuerySchema } from '@/lib/audit/schema';

/** `?action=&actorId=&subjectType=&from=YYYY-MM-DD&to=YYYY-MM-DD&page=` → newest first, 50 a page. */
export const GET = route(async (request) => {
  const actor = await requireActor('audit:view');
  const query = parseQuery(request, auditQuerySchema);
  return json(await listAuditEvents(actor, query));
});
