import type { FleetPeriod } from './views';

/** SWR key of the fleet table, shared by the server page (to seed the cache) and the client table. */
export function fleetKey(period: FleetPeriod): string {
  return `/api/fleet?days=${period}`;
}
