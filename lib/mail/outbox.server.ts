import 'server-only';
import { readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import { env } from '@/lib/env.server';
import { AppError } from '@/lib/errors';
import type { Actor } from '@/lib/auth/views';
import { listStudioDeliveries } from './deliveries.server';
import type { DeliveryView, OutboxMessage, OutboxSummary } from './views';

/**
 * What the local mail catcher saved: each message as `<id>.eml` and a summary `<id>.json`
 * beside it. Files are only ever found by an id that matches OUTBOX_ID, never by a path from outside.
 * A manager sees only the messages Takeproof sent for their own studio (the `X-Takeproof-Studio` header).
 */
export const OUTBOX_ID = /^\d{13}-[0-9a-f]{12}$/;

type Stored = OutboxMessage & { studioId: number | null };

function dir(): string {
  return path.resolve(env().MAIL_OUTBOX_DIR);
}

async function readSummary(id: string): Promise<Stored | null> {
  try {
    const raw = JSON.parse(await readFile(path.join(dir(), `${id}.json`), 'utf8')) as Partial<Stored>;
    return {
      id,
      studioId: raw.studioId == null ? null : Number(raw.studioId),
      receivedAt: String(raw.receivedAt ?? ''),
      from: String(raw.from ?? ''),
      to: Array.isArray(raw.to) ? raw.to.map(String) : [],
      subject: String(raw.subject ?? ''),
      attachments: Array.isArray(raw.attachments) ? raw.attachments.map((a) => ({ filename: String(a.filename ?? ''), contentType: String(a.contentType ?? ''), size: Number(a.size ?? 0) })) : [],
      text: String(raw.text ?? ''),
    };
  } catch {
    return null;
  }
}

/** The caught messages, newest first (at most `limit`). */
export async function listOutbox(actor: Actor, limit = 200): Promise<OutboxSummary[]> {
  let names: string[];
  try {
    names = await readdir(dir());
  } catch {
    return [];
  }
  const ids = names
    .filter((n) => n.endsWith('.json'))
    .map((n) => n.slice(0, -5))
    .filter((id) => OUTBOX_ID.test(id))
    .sort()
    .reverse()
    .slice(0, 2000);
  const messages = await Promise.all(ids.map(readSummary));
  return messages
    .filter((m): m is Stored => m !== null && m.studioId === actor.studioId)
    .slice(0, limit)
    .map(({ text: _text, studioId: _studio, ...summary }) => summary);
}

/** One caught message with its plain text; 404 for an id of the wrong shape or one that is gone. */
export async function getOutboxMessage(actor: Actor, id: string): Promise<OutboxMessage> {
  if (!OUTBOX_ID.test(id)) throw new AppError('not_found:message', 'There is no such message in the outbox.');
  const message = await readSummary(id);
  if (!message || message.studioId !== actor.studioId) throw new AppError('not_found:message', 'There is no such message in the outbox.');
  const { studioId: _studio, ...rest } = message;
  return rest;
}

/** The outbox page: the studio's outgoing e-mail with its status, and what the local mail catcher received. */
export async function outboxOverview(actor: Actor): Promise<{ deliveries: DeliveryView[]; messages: OutboxSummary[] }> {
  return { deliveries: await listStudioDeliveries(actor), messages: await listOutbox(actor) };
}
