import { z } from 'zod';

const day = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2026-12-02')
  .optional()
  .or(z.literal('').transform(() => undefined));
const blankToUndefined = (v: unknown) => (v === '' ? undefined : v);

/** Filters of the audit log; every one optional. Dates are whole UTC days, `to` included. */
export const auditQuerySchema = z
  .object({
    action: z.preprocess(blankToUndefined, z.string().trim().max(64).optional()),
    actorId: z.preprocess(blankToUndefined, z.coerce.number().int().positive('Choose a person from the list').optional()),
    subjectType: z.preprocess(blankToUndefined, z.string().trim().max(32).optional()),
    from: day,
    to: day,
    page: z.preprocess(blankToUndefined, z.coerce.number().int().min(1).max(100000).default(1)),
  })
  .refine((q) => !q.from || !q.to || q.from <= q.to, { message: 'The start date is after the end date', path: ['to'] });
export type AuditQuery = z.infer<typeof auditQuerySchema>;
