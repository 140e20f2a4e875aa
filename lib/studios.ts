import 'server-only';
import { ensureDb } from './db';
import type { Actor } from './auth/guard';
import { Studio } from '@/models';

export async function studioName(actor: Actor): Promise<string> {
  ensureDb();
  return (await Studio.findByPk(actor.studioId))?.name ?? '';
}
