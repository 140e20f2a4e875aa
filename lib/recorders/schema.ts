import { z } from 'zod';

const optionalText = (max: number, what: string) =>
  z
    .string()
    .trim()
    .max(max, `Keep the ${what} under ${max} characters`)
    .transform((s) => (s === '' ? null : s))
    .nullable()
    .optional();

/** Fields of a recorder in the studio's fleet, shared by the forms, the API and the service. */
export const recorderFieldsSchema = z.object({
  label: z.string({ error: 'Give the recorder a label' }).trim().min(1, 'Give the recorder a label').max(120, 'Keep the label under 120 characters'),
  makeModel: optionalText(160, 'make and model'),
  serial: optionalText(120, 'serial number'),
  location: optionalText(160, 'location'),
  notes: optionalText(5000, 'notes'),
  bextMatch: z
    .string()
    .trim()
    .max(160, 'Keep the match text under 160 characters')
    .refine((s) => s === '' || s.length >= 3, 'Use at least 3 characters, so the text cannot match takes from other recorders by chance')
    .transform((s) => (s === '' ? null : s))
    .nullable()
    .optional(),
});

export const createRecorderSchema = recorderFieldsSchema;
export type CreateRecorderInput = z.infer<typeof createRecorderSchema>;

export const updateRecorderSchema = recorderFieldsSchema.partial().extend({
  /** false retires the recorder: it is hidden by default and no longer matched to new takes. */
  active: z.boolean({ error: 'Choose active or retired' }).optional(),
});
export type UpdateRecorderInput = z.infer<typeof updateRecorderSchema>;

export const recorderQuerySchema = z.object({
  status: z.enum(['active', 'retired', 'all'], { error: 'Use active, retired or all' }).default('active'),
});

/** Explained wherever the match text is edited. */
export const BEXT_MATCH_HELP =
  'Text that appears in the recorder’s BWF originator fields (originator or originator reference). Takeproof assigns uploaded takes to this recorder when it matches; capitals do not matter.';
