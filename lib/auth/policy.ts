import type { Role } from '@/models/User';

/**
 * What each role may do. Roles are data: guards, services, pages and the navigation read this
 * table; nothing compares role names elsewhere. Safe to import from client components.
 */
export const CAPABILITIES = {
  'session:view': ['engineer', 'producer', 'manager'],
  /** The overview lists every open session of the studio, not only the ones the person runs. */
  'session:oversee': ['producer', 'manager'],
  'session:create': ['engineer', 'manager'],
  /** A session this person creates without naming an engineer names them its engineer. */
  'session:run': ['engineer'],
  'session:edit': ['engineer', 'producer', 'manager'],
  'take:upload': ['engineer', 'manager'],
  'take:remeasure': ['engineer', 'manager'],
  /** Removes a take this person uploaded, while nobody has decided on it yet. */
  'take:remove': ['engineer', 'manager'],
  /** Removes any take of the studio, decided or not. */
  'take:purge': ['manager'],
  'take:decide': ['producer', 'manager'],
  'take:comment': ['producer', 'manager', 'engineer'],
  'report:send': ['producer', 'manager'],
  'recorder:manage': ['manager'],
  /** Download the check signal, upload a recording of it and read the results (baselines, thresholds and the interval need recorder:manage). */
  'converter:check': ['engineer', 'manager'],
  'spec:manage': ['manager'],
  /** The studio always keeps at least one active person with this capability. */
  'user:manage': ['manager'],
  'fleet:view': ['manager'],
  'audit:view': ['manager'],
  'mail:view': ['manager'],
} as const satisfies Record<string, readonly Role[]>;

export type Capability = keyof typeof CAPABILITIES;

export function can(role: Role, capability: Capability): boolean {
  return (CAPABILITIES[capability] as readonly Role[]).includes(role);
}

/** The roles that have `capability`, e.g. to find the people who may still manage the team. */
export function rolesWith(capability: Capability): Role[] {
  return [...CAPABILITIES[capability]];
}

/** Whether this person may remove this take: their own upload before any decision, or any take with `take:purge`. */
export function mayRemoveTake(actor: { id: number; role: Role }, take: { uploadedById: number | null; decision: string }): boolean {
  if (can(actor.role, 'take:purge')) return true;
  return can(actor.role, 'take:remove') && take.uploadedById === actor.id && take.decision === 'pending';
}

/** How each role is named on pages and in e-mails. */
export const ROLE_LABEL: Record<Role, string> = { engineer: 'Engineer', producer: 'Producer', manager: 'Studio manager' };
