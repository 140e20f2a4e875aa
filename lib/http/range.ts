/**
 * HTTP byte ranges (RFC 9110 §14) and Content-Disposition (RFC 6266 + RFC 5987)
 * for streaming stored takes. Pure functions, no server imports.
 */
import { withoutControlCharacters } from '@/lib/format';

/** What to send for a Range header against an object of `size` bytes. */
export type RangeAnswer =
  /** No Range header, or one we ignore: send the whole object with 200. */
  | { kind: 'full' }
  /** One satisfiable range, both ends inclusive: send 206 with Content-Range. */
  | { kind: 'partial'; start: number; end: number }
  /** A well-formed range that lies wholly past the end: send 416 with `Content-Range: bytes *\/size`. */
  | { kind: 'unsatisfiable' };

const DIGITS = /^\d{1,15}$/;

/**
 * Reads a Range header.
 *
 * - `bytes=0-1023` → those bytes (the end is clamped to the last byte);
 * - `bytes=-500` → the last 500 bytes (the whole object when it is shorter);
 * - `bytes=1000-` → from byte 1000 to the end;
 * - a range starting at or past the end, `bytes=-0`, or any suffix of an empty object → unsatisfiable;
 * - anything malformed (another unit, missing `=`, letters, negative or reversed ends,
 *   numbers beyond 15 digits, an empty list) → ignored, the whole object is sent,
 *   as RFC 9110 allows a server to ignore a Range header;
 * - several ranges (`bytes=0-1,5-9`) → ignored as well: Takeproof does not send
 *   multipart/byteranges, and media players only ever ask for one range.
 * The unit is matched case-insensitively and blanks around the numbers are allowed.
 */
export function parseRange(header: string | null | undefined, size: number): RangeAnswer {
  if (header == null) return { kind: 'full' };
  const eq = header.indexOf('=');
  if (eq < 0 || header.slice(0, eq).trim().toLowerCase() !== 'bytes') return { kind: 'full' };
  const specs = header.slice(eq + 1).split(',').map((s) => s.trim());
  if (specs.length !== 1 || specs[0] === '') return { kind: 'full' };
  const spec = specs[0];
  const dash = spec.indexOf('-');
  if (dash < 0) return { kind: 'full' };
  const first = spec.slice(0, dash).trim();
  const last = spec.slice(dash + 1).trim();

  if (first === '') {
    // Suffix range: the last N bytes.
    if (!DIGITS.test(last)) return { kind: 'full' };
    const length = Number(last);
    if (length === 0 || size === 0) return { kind: 'unsatisfiable' };
    return { kind: 'partial', start: Math.max(0, size - length), end: size - 1 };
  }
  if (!DIGITS.test(first)) return { kind: 'full' };
  const start = Number(first);
  if (last !== '' && !DIGITS.test(last)) return { kind: 'full' };
  const end = last === '' ? size - 1 : Number(last);
  if (last !== '' && end < start) return { kind: 'full' };
  if (start >= size) return { kind: 'unsatisfiable' };
  return { kind: 'partial', start, end: Math.min(end, size - 1) };
}

/** The Content-Range value of a 206 answer. */
export function contentRange(start: number, end: number, size: number): string {
  return `bytes ${start}-${end}/${size}`;
}

const MAX_NAME_CHARS = 180;

/**
 * A take's file name safe to offer for saving: the last path segment only, no control or
 * bidirectional characters, no leading dots, at most 180 characters, never empty, and always
 * ending in `.wav` — a take is a WAV file whatever extension it was uploaded with.
 */
export function safeFileName(name: string): string {
  let base = withoutControlCharacters(name);
  base = base.split(/[/\\]/).pop() ?? '';
  base = base.replace(/\.[^.\s]{1,8}$/, '').replace(/^[\s.]+|[\s.]+$/g, '');
  const chars = Array.from(base || 'take').slice(0, MAX_NAME_CHARS - '.wav'.length);
  return `${chars.join('')}.wav`;
}

/** RFC 5987 value-chars: everything else is percent-encoded from UTF-8. */
function encodeRfc5987(value: string): string {
  return encodeURIComponent(value).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
}

/**
 * A Content-Disposition header for a stored take: an ASCII `filename="…"`
 * fallback (non-ASCII, quotes, backslashes and `%` replaced by `_`) plus the
 * exact cleaned name in `filename*=UTF-8''…`.
 */
export function contentDisposition(originalName: string, disposition: 'inline' | 'attachment' = 'inline'): string {
  const name = safeFileName(originalName);
  const ascii = name.replace(/[^\x20-\x7e]|["\\%]/gu, '_');
  return `${disposition}; filename="${ascii}"; filename*=UTF-8''${encodeRfc5987(name)}`;
}
