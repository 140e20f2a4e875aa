/**
 * One error vocabulary for the whole app: services throw `AppError('not_found:session')`,
 * the route wrapper turns it into a response, the client fetcher rebuilds it.
 * Safe to import from the browser (no server imports).
 */
import type { z } from 'zod';

export const ERROR_KINDS = {
  unauthorized: { status: 401, message: 'Please sign in to continue.' },
  forbidden: { status: 403, message: 'Your role does not allow this.' },
  not_found: { status: 404, message: 'Nothing was found here.' },
  not_allowed: { status: 405, message: 'This address does not take that kind of request.' },
  invalid: { status: 400, message: 'Some of what was sent is not valid.' },
  conflict: { status: 409, message: 'This clashes with something that already exists.' },
  too_large: { status: 413, message: 'The file is larger than this studio allows.' },
  unsatisfiable: { status: 416, message: 'That part of the file does not exist.' },
  unsupported: { status: 415, message: 'This kind of file is not accepted here.' },
  rate_limited: { status: 429, message: 'Too many attempts. Please wait and try again.' },
  insufficient_storage: { status: 507, message: 'Takeproof’s storage is full. Nothing was kept; ask the studio manager to free space.' },
  unavailable: { status: 503, message: 'Takeproof cannot reach its database right now. Try again in a moment.' },
  internal: { status: 500, message: 'Something went wrong on our side. It has been logged.' },
} as const;

export type ErrorKind = keyof typeof ERROR_KINDS;
/** `kind:subject`, e.g. `not_found:session`, `invalid:upload`. */
export type ErrorCode = `${ErrorKind}:${string}`;

export type FieldErrors = Record<string, string[]>;

/** A zod error as field errors, the shape the API answers with and forms show beside each field. */
export function fieldErrorsOf(error: z.ZodError): FieldErrors {
  const fields: FieldErrors = {};
  for (const issue of error.issues) {
    const key = issue.path.join('.') || '_';
    (fields[key] ??= []).push(issue.message);
  }
  return fields;
}

export class AppError extends Error {
  readonly code: ErrorCode;
  readonly kind: ErrorKind;
  readonly status: number;
  readonly fields?: FieldErrors;
  readonly extra?: Record<string, unknown>;

  constructor(code: ErrorCode, message?: string, options: { fields?: FieldErrors; extra?: Record<string, unknown> } = {}) {
    const kind = code.split(':')[0] as ErrorKind;
    super(message ?? ERROR_KINDS[kind].message);
    this.name = 'AppError';
    this.code = code;
    this.kind = kind;
    this.status = ERROR_KINDS[kind].status;
    this.fields = options.fields;
    this.extra = options.extra;
  }
}

/** The JSON body of every error response. */
export interface ErrorBody {
  error: ErrorCode;
  message: string;
  fields?: FieldErrors;
  [key: string]: unknown;
}
