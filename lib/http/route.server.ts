import 'server-only';
import { NextRequest, NextResponse } from 'next/server';
import { z } from 'zod';
import { env } from '@/lib/env.server';
import { AppError, fieldErrorsOf, type ErrorBody } from '@/lib/errors';
import { LONE_SURROGATE } from '@/lib/format';
import { isDatabaseDown } from '@/lib/db/availability.server';

type Handler<C> = (request: Request, context: C) => Promise<Response>;

/** Turns any thrown error into the JSON error response; the only place that maps errors to status codes. */
export function errorResponse(error: unknown): Response {
  let appError: AppError;
  if (error instanceof AppError) appError = error;
  else if (error instanceof z.ZodError) appError = new AppError('invalid:input', 'Some fields need attention.', { fields: fieldErrorsOf(error) });
  else if (isDatabaseDown(error)) appError = new AppError('unavailable:database');
  else {
    console.error('Unhandled error in a route handler:', error);
    appError = new AppError('internal:server');
  }
  const body: ErrorBody = { error: appError.code, message: appError.message, ...(appError.fields ? { fields: appError.fields } : {}), ...appError.extra };
  const headers: Record<string, string> = { 'Cache-Control': 'no-store' };
  if (appError.extra?.retryAfterSec) headers['Retry-After'] = String(appError.extra.retryAfterSec);
  if (typeof appError.extra?.allow === 'string') headers.Allow = appError.extra.allow;
  // RFC 9110 §15.5.17: a 416 names the current length of the object.
  if (appError.kind === 'unsatisfiable' && typeof appError.extra?.size === 'number') headers['Content-Range'] = `bytes */${appError.extra.size}`;
  return NextResponse.json(body, { status: appError.status, headers });
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** The largest body a route reads before refusing it, for everything but uploads (forms, settings, sign-in). */
const MAX_BODY_BYTES = 256 * 1024;

/** What a state-changing request may send: JSON (every route's default), a multipart upload, a part of a resumable (tus) upload, or next-auth's sign-in forms. */
export type BodyKind = 'json' | 'multipart' | 'upload-part' | 'form';

/** Uploads stream their bodies into storage, under limits of their own; every other body is bounded here. */
const STREAMED: ReadonlySet<BodyKind> = new Set(['multipart', 'upload-part']);

const ACCEPTED_TYPES: Record<BodyKind, { type: RegExp; name: string }> = {
  json: { type: /^application\/json\s*(;|$)/i, name: 'JSON (Content-Type: application/json)' },
  multipart: { type: /^multipart\/form-data\s*;/i, name: 'multipart/form-data' },
  'upload-part': { type: /^application\/offset\+octet-stream\s*(;|$)/i, name: 'application/offset+octet-stream (a resumable upload’s part)' },
  form: { type: /^application\/x-www-form-urlencoded\s*(;|$)/i, name: 'a form (application/x-www-form-urlencoded)' },
};

const NOT_OWN_PAGE = 'Changes must come from Takeproof’s own pages.';

/** The origins of Takeproof's own pages: the configured address, and the address this request was sent to. */
function ownOrigins(request: Request): string[] {
  const origins = [new URL(env().NEXTAUTH_URL).origin];
  const host = request.headers.get('host');
  if (host) origins.push(`http://${host}`, `https://${host}`);
  return origins;
}

/**
 * A browser names the page's origin on every request that changes data, and `Sec-Fetch-Site` says
 * whether that page is Takeproof's own. A request naming no origin, or another one, is refused:
 * a page on another port or a sibling host must not act with the visitor's cookie.
 */
function assertSameOrigin(request: Request): void {
  const site = request.headers.get('sec-fetch-site');
  if (site !== null && site !== 'same-origin') throw new AppError('forbidden:origin', NOT_OWN_PAGE);
  const origin = request.headers.get('origin');
  if (origin === null || !ownOrigins(request).includes(origin.toLowerCase())) throw new AppError('forbidden:origin', NOT_OWN_PAGE);
}

function hasBody(request: Request): boolean {
  return request.headers.has('transfer-encoding') || Number(request.headers.get('content-length') ?? 0) > 0;
}

/** Only the body kind the route reads: a form or text body could be sent by another site's page without asking. */
function assertContentType(request: Request, kind: BodyKind): void {
  const type = request.headers.get('content-type');
  if (type === null && !hasBody(request)) return;
  if (type !== null && ACCEPTED_TYPES[kind].type.test(type)) return;
  throw new AppError('unsupported:content_type', `Send the request body as ${ACCEPTED_TYPES[kind].name}.`);
}

const tooLarge = () => new AppError('too_large:body', `The request body is larger than Takeproof reads (${MAX_BODY_BYTES / 1024} KiB).`);

/** Reads at most MAX_BODY_BYTES; a longer body is refused as soon as it passes the limit, without reading the rest. */
async function boundedBody(request: Request): Promise<Uint8Array<ArrayBuffer>> {
  if (Number(request.headers.get('content-length') ?? 0) > MAX_BODY_BYTES) throw tooLarge();
  if (!request.body) return new Uint8Array(0);
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > MAX_BODY_BYTES) {
      await reader.cancel();
      throw tooLarge();
    }
    chunks.push(value);
  }
  const body = new Uint8Array(total);
  let at = 0;
  for (const chunk of chunks) {
    body.set(chunk, at);
    at += chunk.byteLength;
  }
  return body;
}

/** The request again, with its (bounded) body already read into memory. */
async function withBoundedBody(request: Request): Promise<Request> {
  const body = await boundedBody(request);
  const headers = new Headers(request.headers);
  headers.delete('transfer-encoding');
  headers.set('content-length', String(body.byteLength));
  return new NextRequest(request.url, { method: request.method, headers, body: body.byteLength ? body : undefined });
}

/**
 * Wraps every route handler. A request that changes data must come from Takeproof's own pages
 * (Origin, Sec-Fetch-Site → 403), carry the body kind the route reads (→ 415) and, unless it is an
 * upload, fit in MAX_BODY_BYTES (→ 413, refused before it is read). Every error becomes the JSON
 * error answer. The handler inside reads guard → parse → one service → answer.
 */
export function route<C = unknown>(handler: Handler<C>, options: { body?: BodyKind } = {}): Handler<C> {
  const kind = options.body ?? 'json';
  return async (request, context) => {
    try {
      if (SAFE_METHODS.has(request.method)) return await handler(request, context);
      assertSameOrigin(request);
      assertContentType(request, kind);
      return await handler(STREAMED.has(kind) ? request : await withBoundedBody(request), context);
    } catch (error) {
      return errorResponse(error);
    }
  };
}

interface ParseOptions {
  /** zod's error map for this schema's messages (e.g. the delivery-spec units). */
  error?: z.core.$ZodErrorMap;
  /** An empty body reads as `{}` (for requests whose every field is optional). */
  optionalBody?: boolean;
}

/** True when every string inside `value` is well-formed UTF-16 (no lone surrogate, which no database column can keep). */
function wellFormed(value: unknown): boolean {
  if (typeof value === 'string') return !LONE_SURROGATE.test(value);
  if (Array.isArray(value)) return value.every(wellFormed);
  if (value && typeof value === 'object') return Object.entries(value).every(([k, v]) => wellFormed(k) && wellFormed(v));
  return true;
}

const BROKEN_TEXT = 'Some text holds a broken character (half of an emoji or other symbol). Remove it and try again.';

/** Reads a JSON body (the route wrapper has checked its type and size) and validates it: bad JSON and bad fields become `invalid:*` errors. */
export async function parseJson<T extends z.ZodType>(request: Request, schema: T, options: ParseOptions = {}): Promise<z.infer<T>> {
  const text = await request.text();
  let body: unknown = {};
  if (text.trim()) {
    try {
      body = JSON.parse(text);
    } catch {
      throw new AppError('invalid:json', 'The request body is not valid JSON.');
    }
    if (!wellFormed(body)) throw new AppError('invalid:text', BROKEN_TEXT);
  } else if (!options.optionalBody) throw new AppError('invalid:json', 'The request body is not valid JSON.');
  return schema.parse(body, options.error ? { error: options.error } : undefined);
}

/** Reads a route's query string (`?a=1&b=2`, one value per name) and validates it. */
export function parseQuery<T extends z.ZodType>(request: Request, schema: T): z.infer<T> {
  const query = Object.fromEntries(new URL(request.url).searchParams);
  if (!wellFormed(query)) throw new AppError('invalid:text', BROKEN_TEXT);
  return schema.parse(query);
}

/** Validates a route's dynamic `[id]` segment. */
export async function idParam(params: Promise<{ id: string }>, subject: string): Promise<number> {
  const { id } = await params;
  const n = Number(id);
  if (!Number.isInteger(n) || n <= 0 || n > 2 ** 31) throw new AppError(`not_found:${subject}`);
  return n;
}

/** A JSON answer. One object is answered bare; lists, and several objects, under their names (`{ takes }`). */
export function json(data: unknown, status = 200): Response {
  // Answers hold a studio's data: no browser or proxy keeps a copy.
  return NextResponse.json(data, { status, headers: { 'Cache-Control': 'no-store' } });
}

/** A non-JSON answer a service prepared: a file or a stream, with its status and headers. */
export interface BodyAnswer {
  status: number;
  headers: Record<string, string>;
  body: BodyInit;
}

export function send(answer: BodyAnswer): Response {
  return new Response(answer.body, { status: answer.status, headers: answer.headers });
}
