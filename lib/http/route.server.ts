import 'server-only';
import { NextResponse } from 'next/server';
import { z } from 'zod';
import { AppError, fieldErrorsOf, type ErrorBody } from '@/lib/errors';
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
  const headers: Record<string, string> = {};
  if (appError.extra?.retryAfterSec) headers['Retry-After'] = String(appError.extra.retryAfterSec);
  // RFC 9110 §15.5.17: a 416 names the current length of the object.
  if (appError.kind === 'unsatisfiable' && typeof appError.extra?.size === 'number') headers['Content-Range'] = `bytes */${appError.extra.size}`;
  return NextResponse.json(body, { status: appError.status, headers });
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** A browser names the page's origin on every request that changes data; another site's page is refused. */
function assertSameOrigin(request: Request): void {
  if (SAFE_METHODS.has(request.method)) return;
  const origin = request.headers.get('origin');
  if (origin === null) return; // not sent by a browser page: scripts and the tests' HTTP client
  const host = request.headers.get('x-forwarded-host') ?? request.headers.get('host');
  let originHost: string | null = null;
  try {
    originHost = new URL(origin).host;
  } catch {
    // `Origin: null` (a sandboxed frame, a file) names no host.
  }
  if (originHost !== host) throw new AppError('forbidden:origin', 'Changes must come from Takeproof’s own pages.');
}

/**
 * Wraps every route handler: refuses state changes from another site's pages, and turns every
 * error into the JSON error answer. The handler inside reads guard → parse → one service → answer.
 */
export function route<C = unknown>(handler: Handler<C>): Handler<C> {
  return async (request, context) => {
    try {
      assertSameOrigin(request);
      return await handler(request, context);
    } catch (error) {
      return errorResponse(error);
    }
  };
}

/** The largest JSON body a route reads (forms and settings; uploads are multipart and stream). */
const MAX_JSON_BYTES = 1024 * 1024;

interface ParseOptions {
  /** zod's error map for this schema's messages (e.g. the delivery-spec units). */
  error?: z.core.$ZodErrorMap;
  /** An empty body reads as `{}` (for requests whose every field is optional). */
  optionalBody?: boolean;
}

/**
 * Reads a JSON body and validates it: bad JSON and bad fields become `invalid:*` errors, a body
 * that is not declared as JSON 415, one over 1 MiB 413.
 */
export async function parseJson<T extends z.ZodType>(request: Request, schema: T, options: ParseOptions = {}): Promise<z.infer<T>> {
  if (Number(request.headers.get('content-length') ?? 0) > MAX_JSON_BYTES) throw new AppError('too_large:body', 'The request body is larger than Takeproof reads (1 MiB).');
  const text = await request.text();
  if (text.length > MAX_JSON_BYTES) throw new AppError('too_large:body', 'The request body is larger than Takeproof reads (1 MiB).');
  let body: unknown = {};
  if (text.trim()) {
    if (!/^application\/json\b/i.test(request.headers.get('content-type') ?? '')) {
      throw new AppError('unsupported:content_type', 'Send the request body as JSON (Content-Type: application/json).');
    }
    try {
      body = JSON.parse(text);
    } catch {
      throw new AppError('invalid:json', 'The request body is not valid JSON.');
    }
  } else if (!options.optionalBody) throw new AppError('invalid:json', 'The request body is not valid JSON.');
  return schema.parse(body, options.error ? { error: options.error } : undefined);
}

/** Reads a route's query string (`?a=1&b=2`, one value per name) and validates it. */
export function parseQuery<T extends z.ZodType>(request: Request, schema: T): z.infer<T> {
  return schema.parse(Object.fromEntries(new URL(request.url).searchParams));
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
  return NextResponse.json(data, { status });
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
