import 'server-only';
import { NextResponse } from 'next/server';
import { z } from 'zod';
import { AppError, fieldErrorsOf, type ErrorBody } from '@/lib/errors';

type Handler<C> = (request: Request, context: C) => Promise<Response>;

function isDatabaseDown(error: unknown): boolean {
  const name = (error as { name?: string } | null)?.name ?? '';
  return name === 'SequelizeConnectionError' || name === 'SequelizeConnectionRefusedError' || name === 'SequelizeConnectionAcquireTimeoutError' || name === 'SequelizeHostNotReachableError';
}

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

/** Wraps a route handler so every error becomes a proper JSON response. */
export function route<C = unknown>(handler: Handler<C>): Handler<C> {
  return async (request, context) => {
    try {
      return await handler(request, context);
    } catch (error) {
      return errorResponse(error);
    }
  };
}

/** Reads a JSON body and validates it; bad JSON and bad fields both become `invalid:*` errors. */
export async function parseJson<T extends z.ZodType>(request: Request, schema: T): Promise<z.infer<T>> {
  let body: unknown;
  try {
    body = await request.json();
  } catch {
    throw new AppError('invalid:json', 'The request body is not valid JSON.');
  }
  return schema.parse(body);
}

/** Validates a route's dynamic `[id]` segment. */
export async function idParam(params: Promise<{ id: string }>, subject: string): Promise<number> {
  const { id } = await params;
  const n = Number(id);
  if (!Number.isInteger(n) || n <= 0 || n > 2 ** 31) throw new AppError(`not_found:${subject}`);
  return n;
}

export function json(data: unknown, status = 200): Response {
  return NextResponse.json(data, { status });
}
