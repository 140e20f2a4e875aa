import type { Capability } from './policy';

/** The app's main navigation; an entry shows only to roles that have its capability. */
export const NAVIGATION: { href: string; label: string; capability: Capability }[] = [
  { href: '/', label: 'Overview', capability: 'session:view' },
  { href: '/sessions', label: 'Sessions', capability: 'session:view' },
  { href: '/fleet', label: 'Fleet', capability: 'fleet:view' },
  { href: '/converter-checks', label: 'Converter checks', capability: 'converter:check' },
  { href: '/specs', label: 'Delivery specs', capability: 'spec:manage' },
  { href: '/team', label: 'Team', capability: 'user:manage' },
  { href: '/audit', label: 'Audit log', capability: 'audit:view' },
  { href: '/outbox', label: 'Outbox', capability: 'mail:view' },
];
