import 'server-only';
import type { Transaction } from 'sequelize';
import { AuditEvent } from '@/models';
import type { Actor } from '@/lib/auth/views';

/** Records who did what to which object. Every mutation calls this inside its transaction. */
export async function audit(
  actor: Actor,
  action: string,
  subject: { type: string; id: number | null },
  detail: Record<string, unknown> | null = null,
  transaction?: Transaction,
): Promise<void> {
  await AuditEvent.create(
    { studioId: actor.studioId, actorId: actor.id, action, subjectType: subject.type, subjectId: subject.id, detail },
    { transaction },
  );
}
