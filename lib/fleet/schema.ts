import { z } from 'zod';
import { parsePeriod, type FleetPeriod } from './views';

/** `?days=7|30|90|all`: the period of the fleet statistics; `fallback` when the parameter is absent. */
export const fleetQuerySchema = (fallback: FleetPeriod) =>
  z.object({
    days: z
      .string()
      .optional()
      .transform((value, ctx) => {
        const period = parsePeriod(value ?? String(fallback));
        if (period === null) {
          ctx.addIssue({ code: 'custom', message: 'Use 7, 30, 90 or all' });
          return z.NEVER;
        }
        return period;
      }),
  });
