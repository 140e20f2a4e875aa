/** A recorder as the API and pages show it; safe to import from client components. */
export interface RecorderView {
  id: number;
  label: string;
  makeModel: string | null;
  serial: string | null;
  location: string | null;
  notes: string | null;
  bextMatch: string | null;
  active: boolean;
  takeCount: number;
  lastMeasuredAt: string | null;
  createdAt: string;
  updatedAt: string;
}
