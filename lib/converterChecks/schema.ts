import { z } from 'zod';
import { converterThresholdsSchema } from '@/dsp/converter/thresholds';

const whole = (what: string) => z.coerce.number({ error: `Give the ${what} as a number` }).int(`Give the ${what} as a whole number`);

/** `?rate=48000&bits=24&channels=2`: the check signal's format; absent fields take the recorder's usual format. */
export const signalFormatQuerySchema = z.object({
  rate: whole('sample rate').min(32_000, 'Use 32 000 Hz or more').max(192_000, 'Use 192 000 Hz or less').optional(),
  bits: z.enum(['16', '24', '32'], { error: 'Use 16, 24 or 32 bits' }).transform((b) => Number(b) as 16 | 24 | 32).optional(),
  channels: whole('channel count').min(1, 'Use 1 to 16 channels').max(16, 'Use 1 to 16 channels').optional(),
});
export type SignalFormatQuery = z.infer<typeof signalFormatQuerySchema>;

/** The thresholds of a recorder model: every field, as the engine's schema defines them. */
export const modelThresholdsSchema = z.object({ thresholds: converterThresholdsSchema });

/** How often each recorder's converter should be checked. */
export const converterIntervalSchema = z.object({
  converterCheckIntervalDays: z.number({ error: 'Give the interval in days' }).int('Use whole days').min(7, 'Use at least 7 days').max(730, 'Use at most 730 days'),
});
