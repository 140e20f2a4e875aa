import 'server-only';
import { getServerSession } from 'next-auth';
import { AppError } from '@/lib/errors';
import { ensureDb } from '@/lib/db/connection.server';
import { User } from '@/models';
import { authOptions } from './options.server';
import { can, type Capability } from './policy';
import type { Actor } from './views';

/** The signed-in actor, or null when signed out (for pages that redirect). */
export async function currentActor(): Promise<Actor | null> {
  const session = await getServerSession(authOptions);
  if (!session?.user?.id) return null;
  ensureDb();
  const user = await User.findByPk(session.user.id);
  // A session issued before a sign-out, deactivation, new password or new role no longer counts.
  if (!user || !user.active || user.sessionVersion !== (session.user.sessionVersion ?? 0)) return null;
  return { id: user.id, studioId: user.studioId, role: user.role, name: user.name, email: user.email };
}

/** 401 when signed out; 403 when the actor's role lacks `capability`. */
export async function requireActor(capability?: Capability): Promise<Actor> {
  const actor = await currentActor();
  if (!actor) throw new AppError('unauthorized:session');
  if (capability && !can(actor.role, capability)) throw new AppError(`forbidden:${capability}`);
  return actor;
}

/** 403 unless the actor's role has `capability` (for checks after the object is loaded). */
export function assertCan(actor: Actor, capability: Capability): void {
  if (!can(actor.role, capability)) throw new AppError(`forbidden:${capability}`);
}
