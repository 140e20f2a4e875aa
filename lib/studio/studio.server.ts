import 'server-only';
import { ensureDb } from '@/lib/db/connection.server';
import type { Actor } from '@/lib/auth/guard.server';
import { Studio } from '@/models';

export async function studioName(actor: Actor): Promise<string> {
  ensureDb();
  return (await Studio.findByPk(actor.studioId))?.name ?? '';
}
