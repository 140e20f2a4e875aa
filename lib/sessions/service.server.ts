import 'server-only';
import { Op, fn, col, type WhereOptions } from 'sequelize';
import { db } from '@/lib/db/connection.server';
import { audit } from '@/lib/audit/record.server';
import { AppError } from '@/lib/errors';
import { DeliverySpec, RecordingSession, Take, User } from '@/models';
import type { CreateSessionInput, UpdateSessionInput } from './schema';
import { rejudgeSession } from '@/lib/takes/verdicts.server';
import type { Actor } from '@/lib/auth/views';
import type { SessionSummary } from './views';
import { can } from '@/lib/auth/policy';

const people = [
  { model: User, as: 'engineer', attributes: ['id', 'name'] },
  { model: User, as: 'producer', attributes: ['id', 'name'] },
  { model: DeliverySpec, as: 'deliverySpec', attributes: ['id', 'name'] },
];

type WithPeople = RecordingSession & {
  engineer?: User | null;
  producer?: User | null;
  deliverySpec?: DeliverySpec | null;
};

function toSummary(s: WithPeople, takeCount: number): SessionSummary {
  const ref = (x: { id: number; name: string } | null | undefined) => (x ? { id: x.id, name: x.name } : null);
  return {
    id: s.id,
    title: s.title,
    client: s.client,
    recordedOn: s.recordedOn,
    room: s.room,
    status: s.status,
    notes: s.notes,
    engineer: ref(s.engineer),
    producer: ref(s.producer),
    deliverySpec: ref(s.deliverySpec),
    takeCount,
    createdAt: s.createdAt.toISOString(),
  };
}

async function takeCounts(sessionIds: number[]): Promise<Map<number, number>> {
  if (sessionIds.length === 0) return new Map();
  const rows = (await Take.findAll({
    attributes: ['sessionId', [fn('COUNT', col('id')), 'n']],
    where: { sessionId: sessionIds },
    group: ['sessionId'],
    raw: true,
  })) as unknown as { sessionId: number; n: number }[];
  return new Map(rows.map((r) => [r.sessionId, Number(r.n)]));
}

/** The studio's sessions, newest first, optionally filtered by text and status. */
export async function listSessions(actor: Actor, query: { q?: string; status?: 'open' | 'closed' | 'all' } = {}): Promise<SessionSummary[]> {
  db();
  const where: WhereOptions = { studioId: actor.studioId };
  if (query.status && query.status !== 'all') Object.assign(where, { status: query.status });
  if (query.q) {
    const like = `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    Object.assign(where, { [Op.or]: [{ title: { [Op.like]: like } }, { client: { [Op.like]: like } }, { room: { [Op.like]: like } }] });
  }
  const sessions = (await RecordingSession.findAll({ where, include: people, order: [['recordedOn', 'DESC'], ['id', 'DESC']], limit: 500 })) as WithPeople[];
  const counts = await takeCounts(sessions.map((s) => s.id));
  return sessions.map((s) => toSummary(s, counts.get(s.id) ?? 0));
}

/** Loads a session of the actor's studio; 404 for a missing one or one of another studio. */
export async function findSession(actor: Actor, id: number): Promise<RecordingSession> {
  db();
  const session = await RecordingSession.findOne({ where: { id, studioId: actor.studioId } });
  if (!session) throw new AppError('not_found:session', 'This session does not exist, or belongs to another studio.');
  return session;
}

export async function getSession(actor: Actor, id: number): Promise<SessionSummary> {
  await findSession(actor, id);
  const session = (await RecordingSession.findByPk(id, { include: people })) as WithPeople;
  const counts = await takeCounts([id]);
  return toSummary(session, counts.get(id) ?? 0);
}

/**
 * Checks that referenced people and spec belong to the actor's studio, and that a newly chosen
 * spec is not archived (`currentSpecId`: the spec the session already has, which it may keep).
 */
async function checkReferences(actor: Actor, input: Partial<CreateSessionInput>, currentSpecId: number | null = null) {
  const fields: Record<string, string[]> = {};
  for (const key of ['engineerId', 'producerId'] as const) {
    const id = input[key];
    if (id != null && !(await User.findOne({ where: { id, studioId: actor.studioId } }))) fields[key] = ['No such person in this studio'];
  }
  if (input.deliverySpecId != null) {
    const spec = await DeliverySpec.findOne({ where: { id: input.deliverySpecId, studioId: actor.studioId }, attributes: ['id', 'archivedAt'] });
    if (!spec) fields.deliverySpecId = ['No such delivery spec in this studio'];
    else if (spec.archivedAt && spec.id !== currentSpecId) fields.deliverySpecId = ['This delivery spec is archived; choose a current one'];
  }
  if (Object.keys(fields).length) throw new AppError('invalid:session', 'Some fields need attention.', { fields });
}

export async function createSession(actor: Actor, input: CreateSessionInput): Promise<SessionSummary> {
  await checkReferences(actor, input);
  const created = await db().transaction(async (transaction) => {
    const session = await RecordingSession.create(
      {
        studioId: actor.studioId,
        title: input.title,
        client: input.client ?? null,
        recordedOn: input.recordedOn ?? null,
        room: input.room ?? null,
        engineerId: input.engineerId ?? (can(actor.role, 'session:run') ? actor.id : null),
        producerId: input.producerId ?? null,
        deliverySpecId: input.deliverySpecId ?? null,
        notes: input.notes ?? null,
      },
      { transaction },
    );
    await audit(actor, 'session.create', { type: 'session', id: session.id }, { title: session.title }, transaction);
    return session;
  });
  return getSession(actor, created.id);
}

export async function updateSession(actor: Actor, id: number, patch: UpdateSessionInput): Promise<SessionSummary> {
  const session = await findSession(actor, id);
  await checkReferences(actor, patch, session.deliverySpecId);
  const changes = Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined));
  if (Object.keys(changes).length === 0) return getSession(actor, id);
  await db().transaction(async (transaction) => {
    const specChanged = 'deliverySpecId' in changes && changes.deliverySpecId !== session.deliverySpecId;
    await session.update(changes, { transaction });
    // A new delivery spec changes every verdict; the stored reports are judged again, no audio is read.
    if (specChanged) await rejudgeSession(id, transaction);
    await audit(actor, 'session.update', { type: 'session', id }, { fields: Object.keys(changes) }, transaction);
  });
  return getSession(actor, id);
}
