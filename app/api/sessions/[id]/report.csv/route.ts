import { route } from '@/lib/http';
import { reportDownload } from '@/lib/reports/download';

type Context = { params: Promise<{ id: string }> };

export const GET = route<Context>(async (_request, { params }) => reportDownload(params, 'csv'));
