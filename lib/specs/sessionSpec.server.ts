import 'server-only';
import { DEFAULT_SPEC, type DeliverySpec as Spec } from '@/dsp/spec';
import type { Transaction } from 'sequelize';
import { DeliverySpec, RecordingSession } from '@/models';
import { jsonColumn } from '@/lib/db/jsonColumn';

/** The delivery spec a session's takes are judged against (Takeproof's defaults when none is set). */
export async function specForSession(sessionId: number, transaction?: Transaction): Promise<Spec> {
  const session = await RecordingSession.findByPk(sessionId, { attributes: ['deliverySpecId'], transaction });
  if (!session?.deliverySpecId) return DEFAULT_SPEC;
  const record = await DeliverySpec.findByPk(session.deliverySpecId, { transaction });
  return record ? toSpec(record) : DEFAULT_SPEC;
}

export function toSpec(record: DeliverySpec): Spec {
  return { ...DEFAULT_SPEC, ...jsonColumn<Partial<Spec> | null>(record.thresholds), name: record.name };
}
