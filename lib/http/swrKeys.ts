import type { FleetPeriod } from '@/lib/fleet/views';

/** SWR keys shared by server pages (to seed the cache) and client components (to read it). */
export function sessionsKey(q = '', status = 'all'): string {
  const params = new URLSearchParams();
  if (q) params.set('q', q);
  if (status !== 'all') params.set('status', status);
  const s = params.toString();
  return `/api/sessions${s ? `?${s}` : ''}`;
}

export function sessionTakesKey(sessionId: number): string {
  return `/api/sessions/${sessionId}/takes`;
}

export function takeKey(takeId: number): string {
  return `/api/takes/${takeId}`;
}

export function takePeaksKey(takeId: number, buckets: number): string {
  return `/api/takes/${takeId}/peaks?buckets=${buckets}`;
}

export function takeCommentsKey(takeId: number): string {
  return `/api/takes/${takeId}/comments`;
}

export function fleetKey(period: FleetPeriod): string {
  return `/api/fleet?days=${period}`;
}

export function recorderChecksKey(recorderId: number): string {
  return `/api/recorders/${recorderId}/converter-checks`;
}

export function converterCheckKey(checkId: number): string {
  return `/api/converter-checks/${checkId}`;
}
