import 'server-only';
import { Op, fn, col, type WhereOptions } from 'sequelize';
import { AuditEvent, DeliverySpec, Recorder, RecordingSession, Take, User } from '@/models';
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
  const names = await subjectNames(actor, rows);
  const events = rows.map((e) => {
    const a = (e as AuditEvent & { actor?: User | null }).actor;
    const detail = jsonColumn<Record<string, unknown> | null>(e.detail);
    const kept = typeof detail?.name === 'string' ? detail.name : typeof detail?.title === 'string' ? detail.title : typeof detail?.label === 'string' ? detail.label : null;
    const subjectName = (e.subjectId != null ? names.get(`${e.subjectType}:${e.subjectId}`) : undefined) ?? kept;
    return { id: Number(e.id), at: e.createdAt.toISOString(), action: e.action, actor: a ? { id: a.id, name: a.name } : null, subjectType: e.subjectType, subjectId: e.subjectId, subjectName, detail };
  });
  return { events, page, pageSize: AUDIT_PAGE_SIZE, total: count, pages: Math.max(1, Math.ceil(count / AUDIT_PAGE_SIZE)) };
}

/** What each object of these rows is called now, keyed `type:id` (one query per kind of object). */
async function subjectNames(actor: Actor, rows: AuditEvent[]): Promise<Map<string, string>> {
  const ids = (type: string) => [...new Set(rows.filter((r) => r.subjectType === type && r.subjectId != null).map((r) => r.subjectId!))];
  const where = (type: string) => ({ id: ids(type), studioId: actor.studioId });
  const named: [string, { id: number; name: string }[]][] = await Promise.all([
    Take.findAll({ where: where('take'), attributes: ['id', 'originalName'] }).then((r) => ['take', r.map((t) => ({ id: t.id, name: t.originalName }))] as [string, { id: number; name: string }[]]),
    RecordingSession.findAll({ where: where('session'), attributes: ['id', 'title'] }).then((r) => ['session', r.map((s) => ({ id: s.id, name: s.title }))] as [string, { id: number; name: string }[]]),
    DeliverySpec.findAll({ where: where('spec'), attributes: ['id', 'name'] }).then((r) => ['spec', r.map((s) => ({ id: s.id, name: s.name }))] as [string, { id: number; name: string }[]]),
    Recorder.findAll({ where: where('recorder'), attributes: ['id', 'label'] }).then((r) => ['recorder', r.map((s) => ({ id: s.id, name: s.label }))] as [string, { id: number; name: string }[]]),
    User.findAll({ where: where('user'), attributes: ['id', 'name'] }).then((r) => ['user', r.map((u) => ({ id: u.id, name: u.name }))] as [string, { id: number; name: string }[]]),
  ]);
  return new Map(named.flatMap(([type, list]) => list.map((o) => [`${type}:${o.id}`, o.name] as [string, string])));
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
