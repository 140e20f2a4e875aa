import { z } from 'zod';
import { deliverySpecSchema } from '@/dsp/spec';
import { THRESHOLD_BY_KEY, type ThresholdKey } from './fields';

/** Sample rates a recorder really records at, Hz (AES5 and the consumer and telephony rates). */
export const STANDARD_SAMPLE_RATES = [8000, 11025, 16000, 22050, 24000, 32000, 44100, 48000, 88200, 96000, 176400, 192000, 352800, 384000] as const;

/** A spec's thresholds as stored (dsp/spec.ts without the name, a required rate one of the standard rates): the one source of ranges. */
const RATE_MESSAGE = `Choose a standard sample rate (${STANDARD_SAMPLE_RATES.join(', ')} Hz), or leave it empty for any rate`;

export const thresholdsSchema = deliverySpecSchema.omit({ name: true }).extend({
  requiredSampleRate: z
    .number()
    .refine((rate) => (STANDARD_SAMPLE_RATES as readonly number[]).includes(rate), { message: RATE_MESSAGE })
    .nullable(),
});

const description = z
  .string()
  .trim()
  .max(2000, 'Keep the description under 2000 characters')
  .transform((s) => (s === '' ? null : s))
  .nullable()
  .optional();

export const createSpecSchema = z.object({
  name: deliverySpecSchema.shape.name,
  description,
  /** Thresholds left out take Takeproof's defaults. */
  thresholds: thresholdsSchema.partial().optional(),
});
export type CreateSpecInput = z.infer<typeof createSpecSchema>;

export const updateSpecSchema = z.object({
  name: deliverySpecSchema.shape.name.optional(),
  description,
  /** Only the thresholds sent change; the rest keep their stored values. */
  thresholds: thresholdsSchema.partial().optional(),
  /** Archive (hide from new sessions) or restore the spec. */
  archived: z.boolean().optional(),
});
export type UpdateSpecInput = z.infer<typeof updateSpecSchema>;

export const duplicateSpecSchema = z.object({ name: deliverySpecSchema.shape.name.optional() });

function range(key: ThresholdKey): { min?: number; max?: number } {
  let schema = thresholdsSchema.shape[key] as unknown as { minValue?: number | null; maxValue?: number | null; unwrap?: () => unknown };
  if (schema.unwrap && schema.minValue === undefined) schema = schema.unwrap() as typeof schema;
  return { min: schema.minValue ?? undefined, max: schema.maxValue ?? undefined };
}

const fmt = (n: number) => String(n);

/**
 * Plain messages, with the threshold's unit, for the checks dsp/spec.ts states without one.
 * Messages written into the schema itself still win (zod gives them precedence).
 */
export const specErrorMap: z.core.$ZodErrorMap = (issue) => {
  const key = issue.path?.[issue.path.length - 1];
  if (key === 'name') {
    if (issue.code === 'too_big') return 'Keep the name under 120 characters';
    return 'Give the spec a name';
  }
  if (typeof key !== 'string' || !(key in THRESHOLD_BY_KEY)) return undefined;
  const field = THRESHOLD_BY_KEY[key as ThresholdKey];
  const unit = field.unit ? ` ${field.unit}` : '';
  if (field.kind === 'boolean') return 'Choose on or off';
  if (field.kind === 'bitDepth') return 'Choose 16, 24 or 32 bits, or leave it empty for any bit depth';
  if (field.kind === 'rate') return RATE_MESSAGE;
  const { min, max } = range(field.key);
  const between = min !== undefined && max !== undefined ? `Use a value from ${fmt(min)} to ${fmt(max)}${unit}` : undefined;
  if (issue.code === 'invalid_type') {
    const expected = (issue as { expected?: string }).expected;
    if (expected === 'int' || (field.kind === 'integer' && issue.input !== undefined && typeof issue.input === 'number')) return `Enter a whole number of${unit}`;
    return field.kind === 'integer' ? `Enter a whole number of${unit}` : `Enter a number in${unit}`;
  }
  if (issue.code === 'too_small' || issue.code === 'too_big') return between;
  return undefined;
};
