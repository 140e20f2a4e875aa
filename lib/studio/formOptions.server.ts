import 'server-only';
import { Op } from 'sequelize';
import { ensureDb } from '@/lib/db/connection.server';
import { DeliverySpec, Recorder, User } from '@/models';
import type { Role } from '@/models/User';
import type { Actor } from '@/lib/auth/views';

/** The studio's delivery specs that are not archived (and `keepId`, a session's own spec even if archived), as choices for forms. */
export async function specOptions(actor: Actor, keepId: number | null = null) {
  ensureDb();
  const specs = await DeliverySpec.findAll({
    where: { studioId: actor.studioId, [Op.or]: [{ archivedAt: null }, ...(keepId ? [{ id: keepId }] : [])] },
    attributes: ['id', 'name'],
    order: [['name', 'ASC']],
  });
  return specs.map((s) => ({ id: s.id, name: s.name }));
}

export async function peopleOptions(actor: Actor, role: Role) {
  ensureDb();
  const users = await User.findAll({ where: { studioId: actor.studioId, role, active: true }, attributes: ['id', 'name'], order: [['name', 'ASC']] });
  return users.map((u) => ({ id: u.id, name: u.name }));
}

export async function recorderOptions(actor: Actor) {
  ensureDb();
  const recorders = await Recorder.findAll({ where: { studioId: actor.studioId, active: true }, attributes: ['id', 'label'], order: [['label', 'ASC']] });
  return recorders.map((r) => ({ id: r.id, name: r.label }));
}
