import 'server-only';
import { Op } from 'sequelize';
import { RecordingSession, Take, User } from '@/models';
import { db } from '@/lib/db/connection.server';
import type { Actor } from '@/lib/auth/views';
import type { DashboardTake } from './views';

type WithSession = Take & { session?: RecordingSession; decidedBy?: User | null };

function toRow(t: WithSession, at: Date | null): DashboardTake {
  return {
    id: t.id,
    name: t.originalName,
    sessionId: t.sessionId,
    sessionTitle: t.session?.title ?? '',
    status: t.status,
    progress: t.progress,
    verdict: t.verdict,
    reason: t.verdict === 'pass' ? null : t.reason,
    decidedBy: t.decidedBy?.name ?? null,
    decisionNote: t.decisionNote,
    at: (at ?? t.createdAt).toISOString(),
  };
}

const withSession = [{ model: RecordingSession, as: 'session', attributes: ['title'] }];
const attributes = { exclude: ['report'] };

/** Takes this person uploaded that are still waiting for, or going through, measurement. */
export async function takesInMeasurement(actor: Actor): Promise<DashboardTake[]> {
  db();
  const takes = (await Take.findAll({
    where: { studioId: actor.studioId, uploadedById: actor.id, status: { [Op.in]: ['queued', 'measuring'] } },
    include: withSession, attributes, order: [['id', 'ASC']], limit: 50,
  })) as WithSession[];
  return takes.map((t) => toRow(t, t.createdAt));
}

/** Measured takes nobody has decided on yet: the producer's review queue, failing takes first. */
export async function takesAwaitingReview(actor: Actor): Promise<DashboardTake[]> {
  db();
  const takes = (await Take.findAll({
    where: { studioId: actor.studioId, status: 'measured', decision: 'pending' },
    include: withSession, attributes, order: [['verdict', 'DESC'], ['measuredAt', 'ASC']], limit: 50,
  })) as WithSession[];
  return takes.map((t) => toRow(t, t.measuredAt));
}

/** The studio's most recent rejections, with who rejected and why. */
export async function recentRejects(actor: Actor): Promise<DashboardTake[]> {
  db();
  const takes = (await Take.findAll({
    where: { studioId: actor.studioId, decision: 'rejected' },
    include: [...withSession, { model: User, as: 'decidedBy', attributes: ['name'] }], attributes, order: [['verdict', 'DESC'], ['decidedAt', 'DESC']], limit: 10,
  })) as WithSession[];
  return takes.map((t) => toRow(t, t.decidedAt));
}

/** Open sessions; for an engineer, the ones they run. */
export async function openSessionsFor(actor: Actor, mineOnly: boolean) {
  db();
  const where = { studioId: actor.studioId, status: 'open' as const, ...(mineOnly ? { engineerId: actor.id } : {}) };
  const sessions = await RecordingSession.findAll({ where, order: [['recordedOn', 'DESC'], ['id', 'DESC']], limit: 20 });
  return sessions.map((s) => ({ id: s.id, title: s.title, client: s.client, recordedOn: s.recordedOn }));
}
