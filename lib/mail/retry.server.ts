import 'server-only';
import { assertCan } from '@/lib/auth/guard.server';
import { audit } from '@/lib/audit/record.server';
import { AppError } from '@/lib/errors';
import { findSession } from '@/lib/sessions/service.server';
import { resendInvitation, sendPasswordReset } from '@/lib/team/service.server';
import { deliveryPayload, findDelivery, getDelivery } from './deliveries.server';
import { queueAgain } from './queue.server';
import type { Actor } from '@/lib/auth/views';
import type { DeliveryView } from './views';

const STUCK_AFTER_MS = 5 * 60_000;

/**
 * Sends a failed e-mail again, rendered from the current data: a report goes back in the outbox,
 * an invitation or a password reset is sent at once with a fresh link.
 */
export async function retryDelivery(actor: Actor, id: number): Promise<DeliveryView> {
  const delivery = await findDelivery(actor, id);
  assertCan(actor, delivery.kind === 'session_report' ? 'report:send' : 'user:manage');
  // A send that never finished (the server stopped mid-way) counts as failed after a few minutes.
  const stuck = delivery.status === 'sending' && Date.now() - delivery.updatedAt.getTime() > STUCK_AFTER_MS;
  if (delivery.status !== 'failed' && !stuck) throw new AppError('conflict:delivery_not_failed', 'Only an e-mail that failed can be sent again.');
  if (delivery.kind !== 'session_report') {
    const send = delivery.kind === 'invitation' ? resendInvitation : sendPasswordReset;
    return (await send(actor, Number(deliveryPayload(delivery).userId), delivery)).delivery;
  }
  const { sessionId } = deliveryPayload(delivery) as { sessionId: number };
  await findSession(actor, Number(sessionId));
  await audit(actor, 'mail.retry', { type: 'session', id: Number(sessionId) }, { deliveryId: delivery.id });
  await queueAgain(delivery);
  return getDelivery(delivery.studioId, delivery.id);
}
