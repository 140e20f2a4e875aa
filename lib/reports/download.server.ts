import 'server-only';
import type { Actor } from '@/lib/auth/views';
import type { BodyAnswer } from '@/lib/http/route.server';
import { reportFileBase } from './content';
import { takesCsv } from './csv';
import { loadReport } from './data.server';
import { reportPdf } from './pdf.server';

/** A session report as a file to save (PDF or CSV); the file name is built from safe ASCII only. */
export async function reportFile(actor: Actor, sessionId: number, kind: 'pdf' | 'csv'): Promise<BodyAnswer> {
  const data = await loadReport(actor, sessionId);
  const filename = `${reportFileBase(data)}.${kind}`;
  return {
    status: 200,
    headers: {
      'Content-Type': kind === 'pdf' ? 'application/pdf' : 'text/csv; charset=utf-8',
      'Content-Disposition': `attachment; filename="${filename}"`,
      'Cache-Control': 'private, no-store',
    },
    body: kind === 'pdf' ? new Uint8Array(await reportPdf(data)) : takesCsv(data.takes),
  };
}
