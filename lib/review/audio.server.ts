import 'server-only';
import type { Actor } from '@/lib/auth/views';
import { AppError } from '@/lib/errors';
import { contentDisposition, contentRange, parseRange } from '@/lib/http/range';
import type { BodyAnswer } from '@/lib/http/route.server';
import { storage, storedBody } from '@/lib/storage/storage.server';
import { findTake } from '@/lib/takes/service.server';

/** What the player (or a download) asked for: the request's Range and If-Range headers, and `?download=1`. */
export interface AudioRequest {
  range: string | null;
  ifRange: string | null;
  download: boolean;
}

/**
 * The stored WAV of a take, whole (200) or one byte range (206; see `parseRange` for what is
 * accepted), streamed from storage. The ETag is the file's SHA-256, so a range asked for with
 * If-Range is only served against the version the client already holds.
 */
export async function takeAudioStream(actor: Actor, id: number, request: AudioRequest): Promise<BodyAnswer> {
  const take = await findTake(actor, id);
  const stat = await storage().stat(take.storageKey);
  if (!stat) throw new AppError('not_found:audio', 'The audio of this take is missing from storage.');
  const size = stat.bytes;
  const etag = `"${take.sha256}"`;
  const range = request.ifRange && request.ifRange !== etag ? { kind: 'full' as const } : parseRange(request.range, size);
  if (range.kind === 'unsatisfiable') {
    throw new AppError('unsatisfiable:range', `That range lies outside the ${size} bytes of this take.`, { extra: { size } });
  }
  const headers: Record<string, string> = {
    'Content-Type': 'audio/wav',
    'Accept-Ranges': 'bytes',
    'Content-Disposition': contentDisposition(take.originalName, request.download ? 'attachment' : 'inline'),
    'Cache-Control': 'no-store',
    ETag: etag,
    'X-Content-Type-Options': 'nosniff',
  };
  // No Content-Length: Next.js drops it from route handler responses and sends them chunked;
  // Content-Range tells a media element the full size.
  if (range.kind === 'partial') {
    headers['Content-Range'] = contentRange(range.start, range.end, size);
    return { status: 206, headers, body: storedBody(take.storageKey, { start: range.start, end: range.end }) };
  }
  return { status: 200, headers, body: storedBody(take.storageKey) };
}
