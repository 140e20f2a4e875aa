import 'server-only';
import { Op, fn, col, type WhereOptions } from 'sequelize';
import { AuditEvent, User } from '@/models';
import { db } from '@/lib/db/connection.server';
import type { AuditQuery } from './schema';
import type { Actor } from '@/lib/auth/views';
import type { AuditPage } from './views';
import { jsonColumn } from '@/lib/db/jsonColumn';

export const AUDIT_PAGE_SIZE = 50;

/** The studio's audit events, newest first, filtered and one page at a time. */
export async function listAuditEvents(actor: Actor, query: AuditQuery): Promise<AuditPage> {
  db();
  const where: Record<string | symbol, unknown> = { studioId: actor.studioId };
  if (query.action) where.action = query.action;
  if (query.actorId) where.actorId = query.actorId;
  if (query.subjectType) where.subjectType = query.subjectType;
  const range: Record<symbol, Date> = {};
  if (query.from) range[Op.gte] = new Date(`${query.from}T00:00:00Z`);
  if (query.to) range[Op.lt] = new Date(new Date(`${query.to}T00:00:00Z`).getTime() + 86_400_000);
  if (query.from || query.to) where.createdAt = range;
  const page = query.page ?? 1;
  const { rows, count } = await AuditEvent.findAndCountAll({
    where: where as WhereOptions,
    include: [{ model: User, as: 'actor', attributes: ['id', 'name'] }],
    order: [['createdAt', 'DESC'], ['id', 'DESC']],
    limit: AUDIT_PAGE_SIZE,
    offset: (page - 1) * AUDIT_PAGE_SIZE,
  });
  const events = rows.map((e) => {
    const a = (e as AuditEvent & { actor?: User | null }).actor;
    const detail = jsonColumn<Record<string, unknown> | null>(e.detail);
    return { id: Number(e.id), at: e.createdAt.toISOString(), action: e.action, actor: a ? { id: a.id, name: a.name } : null, subjectType: e.subjectType, subjectId: e.subjectId, detail };
  });
  return { events, page, pageSize: AUDIT_PAGE_SIZE, total: count, pages: Math.max(1, Math.ceil(count / AUDIT_PAGE_SIZE)) };
}

/** The choices of the filter form: actions and object types that occur, and the studio's people. */
export async function auditFilterOptions(actor: Actor) {
  db();
  const distinct = async (column: 'action' | 'subjectType') =>
    ((await AuditEvent.findAll({ attributes: [[fn('DISTINCT', col(column)), 'v']], where: { studioId: actor.studioId }, raw: true })) as unknown as { v: string }[])
      .map((r) => r.v)
      .sort();
  const people = await User.findAll({ where: { studioId: actor.studioId }, attributes: ['id', 'name'], order: [['name', 'ASC']] });
  return { actions: await distinct('action'), subjectTypes: await distinct('subjectType'), people: people.map((p) => ({ id: p.id, name: p.name })) };
}
