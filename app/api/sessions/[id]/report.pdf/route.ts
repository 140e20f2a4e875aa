import { route } from '@/lib/http/route.server';
import { reportDownload } from '@/lib/reports/download.server';

type Context = { params: Promise<{ id: string }> };

export const GET = route<Context>(async (_request, { params }) => reportDownload(params, 'pdf'));
