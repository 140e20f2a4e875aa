/** A session as lists and pages show it; safe to import from client components. */
export interface SessionSummary {
  id: number;
  title: string;
  client: string | null;
  recordedOn: string | null;
  room: string | null;
  status: 'open' | 'closed';
  notes: string | null;
  engineer: { id: number; name: string } | null;
  producer: { id: number; name: string } | null;
  deliverySpec: { id: number; name: string } | null;
  takeCount: number;
  createdAt: string;
}
