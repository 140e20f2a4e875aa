import { z } from 'zod';

const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `Keep this under ${max} characters`)
    .transform((s) => (s === '' ? null : s))
    .nullable()
    .optional();

const optionalId = z.coerce.number().int().positive().nullable().optional();

/** Fields of a recording session, shared by the create form, the API and the service. */
export const sessionFieldsSchema = z.object({
  title: z.string().trim().min(1, 'Give the session a title').max(200, 'Keep the title under 200 characters'),
  client: optionalText(200),
  recordedOn: z
    .string()
    .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2026-12-02')
    .nullable()
    .optional()
    .or(z.literal('').transform(() => null)),
  room: optionalText(120),
  engineerId: optionalId,
  producerId: optionalId,
  deliverySpecId: optionalId,
  notes: optionalText(5000),
});

export const createSessionSchema = sessionFieldsSchema;
export type CreateSessionInput = z.infer<typeof createSessionSchema>;

export const updateSessionSchema = sessionFieldsSchema.partial().extend({
  status: z.enum(['open', 'closed']).optional(),
});
export type UpdateSessionInput = z.infer<typeof updateSessionSchema>;

export const sessionQuerySchema = z.object({
  q: z.string().trim().max(200).optional(),
  status: z.enum(['open', 'closed', 'all']).default('all'),
});
