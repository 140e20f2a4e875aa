import type { z } from 'zod';
import type { FieldErrors } from '@/lib/errors';

/** A zod error as field errors, the same shape the API answers with (safe in the browser). */
export function fieldErrorsOf(error: z.ZodError): FieldErrors {
  const fields: FieldErrors = {};
  for (const issue of error.issues) {
    const key = issue.path.join('.') || '_';
    (fields[key] ??= []).push(issue.message);
  }
  return fields;
}
