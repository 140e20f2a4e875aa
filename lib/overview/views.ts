import type { Take } from '@/models';

/** A take as the overview lists show it; safe to import from client components. */
export interface DashboardTake {
  id: number;
  name: string;
  sessionId: number;
  sessionTitle: string;
  status: Take['status'];
  progress: number;
  verdict: Take['verdict'];
  reason: string | null;
  decidedBy: string | null;
  decisionNote: string | null;
  at: string;
}
