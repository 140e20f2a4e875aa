import { requireActor } from '@/lib/auth/guard';
import { listAuditEvents } from '@/lib/auditLog';
import { json, route } from '@/lib/http';
import { auditQuerySchema } from '@/lib/schemas/audit';

/** `?action=&actorId=&subjectType=&from=YYYY-MM-DD&to=YYYY-MM-DD&page=` → newest first, 50 a page. */
export const GET = route(async (request) => {
  const actor = await requireActor('audit:view');
  const query = auditQuerySchema.parse(Object.fromEntries(new URL(request.url).searchParams));
  return json(await listAuditEvents(actor, query));
});
