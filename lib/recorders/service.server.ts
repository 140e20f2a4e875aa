import 'server-only';
import { Op, fn, col, type WhereOptions } from 'sequelize';
import { Recorder, Take } from '@/models';
import { audit } from '@/lib/audit/record.server';
import { db } from '@/lib/db/connection.server';
import { AppError } from '@/lib/errors';
import type { CreateRecorderInput, UpdateRecorderInput } from './schema';
import type { Actor } from '@/lib/auth/views';
import type { RecorderView } from './views';

async function takeStats(studioId: number, ids: number[]): Promise<Map<number, { n: number; last: Date | null }>> {
  if (ids.length === 0) return new Map();
  const rows = (await Take.findAll({
    attributes: ['recorderId', [fn('COUNT', col('id')), 'n'], [fn('MAX', col('measuredAt')), 'last']],
    where: { studioId, recorderId: ids },
    group: ['recorderId'],
    raw: true,
  })) as unknown as { recorderId: number; n: number; last: Date | string | null }[];
  return new Map(rows.map((r) => [r.recorderId, { n: Number(r.n), last: r.last ? new Date(r.last) : null }]));
}

function toView(r: Recorder, stats?: { n: number; last: Date | null }): RecorderView {
  return {
    id: r.id,
    label: r.label,
    makeModel: r.makeModel,
    serial: r.serial,
    location: r.location,
    notes: r.notes,
    bextMatch: r.bextMatch,
    active: !!r.active,
    takeCount: stats?.n ?? 0,
    lastMeasuredAt: stats?.last ? stats.last.toISOString() : null,
    createdAt: r.createdAt.toISOString(),
    updatedAt: r.updatedAt.toISOString(),
  };
}

/** The studio's recorders, active ones only unless asked. */
export async function listRecorders(actor: Actor, query: { status?: 'active' | 'retired' | 'all' } = {}): Promise<RecorderView[]> {
  db();
  const where: WhereOptions = { studioId: actor.studioId };
  const status = query.status ?? 'active';
  if (status !== 'all') Object.assign(where, { active: status === 'active' });
  const recorders = await Recorder.findAll({ where, order: [['active', 'DESC'], ['label', 'ASC'], ['id', 'ASC']] });
  const stats = await takeStats(actor.studioId, recorders.map((r) => r.id));
  return recorders.map((r) => toView(r, stats.get(r.id)));
}

export async function findRecorder(actor: Actor, id: number): Promise<Recorder> {
  db();
  const recorder = await Recorder.findOne({ where: { id, studioId: actor.studioId } });
  if (!recorder) throw new AppError('not_found:recorder', 'This recorder does not exist, or belongs to another studio.');
  return recorder;
}

export async function getRecorder(actor: Actor, id: number): Promise<RecorderView> {
  const recorder = await findRecorder(actor, id);
  return toView(recorder, (await takeStats(actor.studioId, [id])).get(id));
}

async function assertLabelFree(actor: Actor, label: string, exceptId?: number) {
  const clash = await Recorder.findOne({ where: { studioId: actor.studioId, label, ...(exceptId ? { id: { [Op.ne]: exceptId } } : {}) }, attributes: ['id'] });
  if (clash) throw new AppError('invalid:recorder', 'Some fields need attention.', { fields: { label: ['Another recorder of this studio already has this label'] } });
}

export async function createRecorder(actor: Actor, input: CreateRecorderInput): Promise<RecorderView> {
  await assertLabelFree(actor, input.label);
  const created = await db().transaction(async (transaction) => {
    const recorder = await Recorder.create(
      {
        studioId: actor.studioId,
        label: input.label,
        makeModel: input.makeModel ?? null,
        serial: input.serial ?? null,
        location: input.location ?? null,
        notes: input.notes ?? null,
        bextMatch: input.bextMatch ?? null,
      },
      { transaction },
    );
    await audit(actor, 'recorder.create', { type: 'recorder', id: recorder.id }, { label: recorder.label }, transaction);
    return recorder;
  });
  return getRecorder(actor, created.id);
}

/** Edits a recorder; `active: false` retires it (its takes and statistics stay). */
export async function updateRecorder(actor: Actor, id: number, patch: UpdateRecorderInput): Promise<RecorderView> {
  const recorder = await findRecorder(actor, id);
  if (patch.label !== undefined) await assertLabelFree(actor, patch.label, id);
  const changes = Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined));
  if (Object.keys(changes).length === 0) return getRecorder(actor, id);
  await db().transaction(async (transaction) => {
    const action = patch.active === false && recorder.active ? 'recorder.retire' : patch.active === true && !recorder.active ? 'recorder.reinstate' : 'recorder.update';
    await recorder.update(changes, { transaction });
    await audit(actor, action, { type: 'recorder', id }, { fields: Object.keys(changes) }, transaction);
  });
  return getRecorder(actor, id);
}
