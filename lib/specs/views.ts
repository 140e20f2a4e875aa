import type { Thresholds } from '@/models/DeliverySpec';

/** A delivery spec as the API and pages show it; safe to import from client components. */
export interface SpecView {
  id: number;
  name: string;
  description: string | null;
  /** Every threshold, Takeproof's defaults filling any the stored spec lacks. */
  thresholds: Thresholds;
  sessionCount: number;
  /** Archived: not offered for new sessions; sessions that use it keep it. */
  archived: boolean;
  createdAt: string;
  updatedAt: string;
}
