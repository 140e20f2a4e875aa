import { Readable } from 'node:stream';
import { requireActor } from '@/lib/auth/guard.server';
import { AppError } from '@/lib/errors';
import { idParam, route } from '@/lib/http/route.server';
import { contentDisposition, contentRange, parseRange } from '@/lib/http/range';
import { storage } from '@/lib/storage/storage.server';
import { takeAudio } from '@/lib/review/service.server';

type Context = { params: Promise<{ id: string }> };

/**
 * The stored WAV of a take, whole or one byte range (see `parseRange` for what is
 * accepted). `?download=1` offers it for saving instead of playing it in place.
 */
export const GET = route<Context>(async (request, { params }) => {
  const actor = await requireActor('session:view');
  const audio = await takeAudio(actor, await idParam(params, 'take'));
  const etag = `"${audio.sha256}"`;
  const ifRange = request.headers.get('if-range');
  // A range is only valid against the version the client already holds.
  const range = ifRange && ifRange !== etag ? { kind: 'full' as const } : parseRange(request.headers.get('range'), audio.size);
  if (range.kind === 'unsatisfiable') {
    throw new AppError('unsatisfiable:range', `That range lies outside the ${audio.size} bytes of this take.`, { extra: { size: audio.size } });
  }
  const download = new URL(request.url).searchParams.get('download') === '1';
  const headers = new Headers({
    'Content-Type': 'audio/wav',
    'Accept-Ranges': 'bytes',
    'Content-Disposition': contentDisposition(audio.name, download ? 'attachment' : 'inline'),
    'Cache-Control': 'private, no-cache',
    ETag: etag,
    'X-Content-Type-Options': 'nosniff',
  });
  // No Content-Length: Next.js drops it from route handler responses and sends them chunked;
  // Content-Range tells a media element the full size.
  if (range.kind === 'partial') {
    headers.set('Content-Range', contentRange(range.start, range.end, audio.size));
    const body = Readable.toWeb(storage().getRange(audio.key, { start: range.start, end: range.end })) as ReadableStream<Uint8Array>;
    return new Response(body, { status: 206, headers });
  }
  const body = Readable.toWeb(storage().getRange(audio.key)) as ReadableStream<Uint8Array>;
  return new Response(body, { status: 200, headers });
});
