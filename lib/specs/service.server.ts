import 'server-only';
import { fn, col, Op } from 'sequelize';
import { DEFAULT_SPEC } from '@/dsp/spec';
import { DeliverySpec, RecordingSession } from '@/models';
import type { Thresholds } from '@/models/DeliverySpec';
import { audit } from '@/lib/audit/record.server';
import { db } from '@/lib/db/connection.server';
import { AppError } from '@/lib/errors';
import type { CreateSpecInput, UpdateSpecInput } from './schema';
import { thresholdsSchema } from './schema';
import { rejudgeSpecSessions } from '@/lib/takes/verdicts.server';
import type { Actor } from '@/lib/auth/views';
import type { SpecView } from './views';
import { jsonColumn } from '@/lib/db/jsonColumn';

const { name: _defaultName, ...DEFAULT_THRESHOLDS } = DEFAULT_SPEC;
export { DEFAULT_THRESHOLDS };

function storedThresholds(record: DeliverySpec): Thresholds {
  return { ...DEFAULT_THRESHOLDS, ...(jsonColumn<Partial<Thresholds> | null>(record.thresholds) ?? {}) };
}

async function sessionCounts(studioId: number, specIds: number[]): Promise<Map<number, number>> {
  if (specIds.length === 0) return new Map();
  const rows = (await RecordingSession.findAll({
    attributes: ['deliverySpecId', [fn('COUNT', col('id')), 'n']],
    where: { studioId, deliverySpecId: specIds },
    group: ['deliverySpecId'],
    raw: true,
  })) as unknown as { deliverySpecId: number; n: number }[];
  return new Map(rows.map((r) => [r.deliverySpecId, Number(r.n)]));
}

function toView(record: DeliverySpec, sessionCount: number): SpecView {
  return {
    id: record.id,
    name: record.name,
    description: record.description,
    thresholds: storedThresholds(record),
    sessionCount,
    archived: record.archivedAt != null,
    createdAt: record.createdAt.toISOString(),
    updatedAt: record.updatedAt.toISOString(),
  };
}

export async function listSpecs(actor: Actor): Promise<SpecView[]> {
  db();
  const specs = await DeliverySpec.findAll({ where: { studioId: actor.studioId }, order: [['archivedAt', 'ASC'], ['name', 'ASC'], ['id', 'ASC']] });
  const counts = await sessionCounts(actor.studioId, specs.map((s) => s.id));
  return specs.map((s) => toView(s, counts.get(s.id) ?? 0));
}

async function findSpec(actor: Actor, id: number): Promise<DeliverySpec> {
  db();
  const spec = await DeliverySpec.findOne({ where: { id, studioId: actor.studioId } });
  if (!spec) throw new AppError('not_found:spec', 'This delivery spec does not exist, or belongs to another studio.');
  return spec;
}

export async function getSpec(actor: Actor, id: number): Promise<SpecView> {
  const spec = await findSpec(actor, id);
  const counts = await sessionCounts(actor.studioId, [id]);
  return toView(spec, counts.get(id) ?? 0);
}

/** Names are unique within a studio, so sessions' spec choices stay unambiguous. */
async function assertNameFree(actor: Actor, name: string, exceptId?: number) {
  const clash = await DeliverySpec.findOne({ where: { studioId: actor.studioId, name, ...(exceptId ? { id: { [Op.ne]: exceptId } } : {}) }, attributes: ['id'] });
  if (clash) throw new AppError('invalid:spec', 'Some fields need attention.', { fields: { name: ['Another delivery spec of this studio already has this name'] } });
}

export async function createSpec(actor: Actor, input: CreateSpecInput): Promise<SpecView> {
  await assertNameFree(actor, input.name);
  const thresholds = thresholdsSchema.parse({ ...DEFAULT_THRESHOLDS, ...(input.thresholds ?? {}) });
  const created = await db().transaction(async (transaction) => {
    const spec = await DeliverySpec.create({ studioId: actor.studioId, name: input.name, description: input.description ?? null, thresholds }, { transaction });
    await audit(actor, 'spec.create', { type: 'spec', id: spec.id }, { name: spec.name }, transaction);
    return spec;
  });
  return getSpec(actor, created.id);
}

/** Edits a spec; when thresholds change, every take of the sessions using it is judged again from its stored report. */
export async function updateSpec(actor: Actor, id: number, patch: UpdateSpecInput): Promise<SpecView & { rejudged: boolean }> {
  const spec = await findSpec(actor, id);
  if (patch.name !== undefined) await assertNameFree(actor, patch.name, id);
  const before = storedThresholds(spec);
  const thresholds = thresholdsSchema.parse({ ...before, ...(patch.thresholds ?? {}) });
  const changedThresholds = (Object.keys(thresholds) as (keyof Thresholds)[]).filter((k) => thresholds[k] !== before[k]);
  await db().transaction(async (transaction) => {
    await spec.update(
      {
        ...(patch.name !== undefined ? { name: patch.name } : {}),
        ...(patch.description !== undefined ? { description: patch.description } : {}),
        ...(patch.archived !== undefined ? { archivedAt: patch.archived ? (spec.archivedAt ?? new Date()) : null } : {}),
        thresholds,
      },
      { transaction },
    );
    await audit(actor, 'spec.update', { type: 'spec', id }, { fields: Object.keys(patch).filter((k) => patch[k as keyof UpdateSpecInput] !== undefined), thresholds: changedThresholds }, transaction);
  });
  // Verdicts follow the thresholds: the stored reports are judged again, no audio is read.
  if (changedThresholds.length) await rejudgeSpecSessions(id);
  return { ...(await getSpec(actor, id)), rejudged: changedThresholds.length > 0 };
}

async function freeCopyName(actor: Actor, base: string): Promise<string> {
  const existing = new Set(
    (await DeliverySpec.findAll({ where: { studioId: actor.studioId }, attributes: ['name'] })).map((s) => s.name),
  );
  for (let n = 1; n < 1000; n++) {
    const suffix = n === 1 ? '' : ` (${n})`;
    const name = `Copy of ${base}`.slice(0, 120 - suffix.length) + suffix;
    if (!existing.has(name)) return name;
  }
  throw new AppError('conflict:spec_name', 'Give the copy a name of its own.');
}

export async function duplicateSpec(actor: Actor, id: number, input: { name?: string }): Promise<SpecView> {
  const source = await findSpec(actor, id);
  const name = input.name ?? (await freeCopyName(actor, source.name));
  await assertNameFree(actor, name);
  const created = await db().transaction(async (transaction) => {
    const spec = await DeliverySpec.create(
      { studioId: actor.studioId, name, description: source.description, thresholds: storedThresholds(source) },
      { transaction },
    );
    await audit(actor, 'spec.duplicate', { type: 'spec', id: spec.id }, { from: id, name }, transaction);
    return spec;
  });
  return getSpec(actor, created.id);
}
