/** Shapes of the audit log as the API and pages show it; safe to import from client components. */

export interface AuditEntry {
  id: number;
  at: string;
  action: string;
  actor: { id: number; name: string } | null;
  subjectType: string;
  subjectId: number | null;
  detail: Record<string, unknown> | null;
}

export interface AuditPage {
  events: AuditEntry[];
  page: number;
  pageSize: number;
  total: number;
  pages: number;
}
