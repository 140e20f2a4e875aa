import { requireActor } from '@/lib/auth/guard.server';
import { idParam, route } from '@/lib/http/route.server';
import { handleResumableUpload } from '@/lib/takes/resumable.server';

type Context = { params: Promise<{ id: string }> };

/** tus creation (`Upload-Length`, `Upload-Metadata: filename …[, sha256 …][, recorderId …]`): answers 201 with the upload's Location. */
export const POST = route<Context>(async (request, { params }) => {
  const actor = await requireActor('take:upload');
  return handleResumableUpload(actor, await idParam(params, 'session'), request);
});
