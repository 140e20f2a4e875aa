import 'server-only';
import { FileStore } from '@tus/file-store';
import { MemoryLocker, Server, type Upload } from '@tus/server';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import type { Actor } from '@/lib/auth/views';
import { env } from '@/lib/env.server';
import { AppError } from '@/lib/errors';
import { cleanFileName } from '@/lib/format';
import { findSession } from '@/lib/sessions/service.server';
import { newTakeKey, storage } from '@/lib/storage/storage.server';
import { UploadCheck, recordTakes } from './uploads.server';
import type { TakeSummary } from './views';

// Resumable uploads with the tus protocol (tus.io, v1.0.0) through @tus/server: the bytes of an
// unfinished upload collect in UPLOAD_RESUME_DIR; once the last byte is in, the file is streamed
// through the same WAV check and SHA-256 as the one-request upload into storage and recorded as
// one take, and the partial file is removed. Unfinished uploads older than UPLOAD_RESUME_EXPIRY_HOURS
// are removed.

/** One lock table per process: two requests for the same upload on this instance take turns. */
const locker = new MemoryLocker();
let store: FileStore | undefined;

function resumeStore(): FileStore {
  const config = env();
  store ??= new FileStore({ directory: path.resolve(config.UPLOAD_RESUME_DIR), expirationPeriodInMilliseconds: config.UPLOAD_RESUME_EXPIRY_HOURS * 3600_000 });
  return store;
}

/** Who an upload belongs to, written into its metadata by the server when it is created. */
const ownerOf = (actor: Actor, sessionId: number) => `${actor.studioId}/${sessionId}/${actor.id}`;

/** An error in the shape @tus/server sends back, with Takeproof's JSON error body. */
function tusError(error: AppError) {
  return { status_code: error.status, body: JSON.stringify({ error: error.code, message: error.message, ...(error.fields ? { fields: error.fields } : {}), ...error.extra }) };
}

/** Streams a finished upload into storage through the WAV check and SHA-256, and records its take. */
async function finish(actor: Actor, sessionId: number, upload: Upload): Promise<TakeSummary> {
  const originalName = cleanFileName(upload.metadata?.filename ?? 'take.wav');
  const key = newTakeKey();
  const check = new UploadCheck(env().UPLOAD_MAX_BYTES, originalName);
  let kept = false;
  try {
    const put = storage().put(key, check);
    await Promise.all([pipeline(resumeStore().read(upload.id), check), put]);
    kept = true;
    const sha256 = check.hash.digest('hex');
    const expected = upload.metadata?.sha256;
    if (expected && expected.toLowerCase() !== sha256) {
      throw new AppError('invalid:upload_checksum', `“${originalName}” arrived with SHA-256 ${sha256}, not the ${expected} it was sent with. Nothing was kept; send it again.`);
    }
    const recorder = upload.metadata?.recorderId;
    const [take] = await recordTakes(actor, sessionId, [{ key, originalName, bytes: check.bytes, sha256 }], recorder ? Number(recorder) : null);
    return take;
  } catch (error) {
    if (kept) await storage().delete(key);
    throw error;
  } finally {
    await resumeStore().remove(upload.id).catch(() => undefined);
  }
}

function tusServer(actor: Actor, sessionId: number): Server {
  return new Server({
    path: `/api/sessions/${sessionId}/uploads`,
    datastore: resumeStore(),
    locker,
    relativeLocation: true,
    allowedOrigins: () => false, // same-origin only: no CORS headers for other sites
    maxSize: env().UPLOAD_MAX_BYTES,
    async onUploadCreate(_request, upload) {
      if (!upload.metadata?.filename) throw tusError(new AppError('invalid:upload', 'Name the file in the upload’s metadata (`filename`).'));
      return { metadata: { ...upload.metadata, owner: ownerOf(actor, sessionId) } };
    },
    async onUploadFinish(_request, upload) {
      try {
        const take = await finish(actor, sessionId, upload);
        return { status_code: 200, headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ takes: [take] }) };
      } catch (error) {
        if (error instanceof AppError) throw tusError(error);
        console.error(`Finishing resumable upload ${upload.id} failed:`, error);
        throw tusError(new AppError('internal:server'));
      }
    },
  });
}

/**
 * Answers one tus request (POST creates, HEAD tells the offset, PATCH appends, DELETE abandons)
 * for a session's resumable uploads. An upload is only reachable by the person who started it,
 * through the session it was started in.
 */
export async function handleResumableUpload(actor: Actor, sessionId: number, request: Request, uploadId?: string): Promise<Response> {
  const session = await findSession(actor, sessionId);
  if (session.status === 'closed' && request.method === 'POST') throw new AppError('conflict:session_closed', 'This session is closed. Reopen it to add takes.');
  if (uploadId !== undefined) {
    const upload = await resumeStore().getUpload(uploadId).catch(() => null);
    if (!upload || upload.metadata?.owner !== ownerOf(actor, sessionId)) throw new AppError('not_found:upload', 'There is no unfinished upload here; it may have finished, been abandoned or expired. Start it again.');
  } else {
    // Creating an upload is a good moment to clear the ones abandoned long ago.
    resumeStore()
      .deleteExpired()
      .catch((error: Error) => console.error(`Removing expired resumable uploads failed: ${error.message}`));
  }
  return tusServer(actor, sessionId).handleWeb(request);
}
