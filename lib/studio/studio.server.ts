import 'server-only';
import { ensureDb } from '@/lib/db/connection.server';
import { Studio } from '@/models';
import type { Actor } from '@/lib/auth/views';

export async function studioName(actor: Actor): Promise<string> {
  ensureDb();
  return (await Studio.findByPk(actor.studioId))?.name ?? '';
}
