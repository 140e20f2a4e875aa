import 'server-only';
import { requireActor } from '@/lib/auth/guard.server';
import { idParam } from '@/lib/http/route.server';
import { takesCsv } from './csv';
import { reportPdf } from './pdf.server';
import { loadReport } from './data.server';
import { reportFileBase } from './content';

/** A report file as a download; the file name is built from safe ASCII only. */
export async function reportDownload(params: Promise<{ id: string }>, kind: 'pdf' | 'csv'): Promise<Response> {
  const actor = await requireActor('session:view');
  const data = await loadReport(actor, await idParam(params, 'session'));
  const filename = `${reportFileBase(data)}.${kind}`;
  const body = kind === 'pdf' ? new Uint8Array(await reportPdf(data)) : takesCsv(data.takes);
  return new Response(body, {
    status: 200,
    headers: {
      'Content-Type': kind === 'pdf' ? 'application/pdf' : 'text/csv; charset=utf-8',
      'Content-Disposition': `attachment; filename="${filename}"`,
      'Cache-Control': 'private, no-store',
    },
  });
}
