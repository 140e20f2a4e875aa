import { requireActor } from '@/lib/auth/guard.server';
import { idParam, route } from '@/lib/http/route.server';
import { AppError } from '@/lib/errors';
import { handleResumableUpload } from '@/lib/takes/resumable.server';

type Context = { params: Promise<{ id: string; uploadId: string }> };

/** One resumable (tus) upload: HEAD tells how many bytes arrived, PATCH appends from there, DELETE abandons it. */
const handler = route<Context>(async (request, { params }) => {
  const actor = await requireActor('take:upload');
  const { uploadId } = await params;
  if (!/^[0-9a-f]{32}$/.test(uploadId)) throw new AppError('not_found:upload');
  return handleResumableUpload(actor, await idParam(params, 'session'), request, uploadId);
}, { body: 'upload-part' });

export { handler as HEAD, handler as PATCH, handler as DELETE };
