/** Shapes of the audit log as the API and pages show it; safe to import from client components. */

export interface AuditEntry {
  id: number;
  at: string;
  action: string;
  actor: { id: number; name: string } | null;
  subjectType: string;
  subjectId: number | null;
  /** What the object is called now (a take's file name, a session's title), or was called when it was removed. */
  subjectName: string | null;
  detail: Record<string, unknown> | null;
}

export interface AuditPage {
  events: AuditEntry[];
  page: number;
  pageSize: number;
  total: number;
  pages: number;
}
