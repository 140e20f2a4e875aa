import type { Role } from '@/models/User';

/**
 * What each role may do. Roles are data: guards and the navigation read this
 * table, nothing compares role names elsewhere.
 */
export const CAPABILITIES = {
  'session:view': ['engineer', 'producer', 'manager'],
  'session:create': ['engineer', 'manager'],
  'session:edit': ['engineer', 'producer', 'manager'],
  'take:upload': ['engineer', 'manager'],
  'take:remeasure': ['engineer', 'manager'],
  'take:decide': ['producer', 'manager'],
  'take:comment': ['producer', 'manager', 'engineer'],
  'report:send': ['producer', 'manager'],
  'recorder:manage': ['manager'],
  'spec:manage': ['manager'],
  'user:manage': ['manager'],
  'fleet:view': ['manager'],
  'audit:view': ['manager'],
  'mail:view': ['manager'],
} as const satisfies Record<string, readonly Role[]>;

export type Capability = keyof typeof CAPABILITIES;

export function can(role: Role, capability: Capability): boolean {
  return (CAPABILITIES[capability] as readonly Role[]).includes(role);
}
