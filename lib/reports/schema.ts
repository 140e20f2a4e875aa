import { z } from 'zod';

/** One e-mail address, trimmed and lower-cased; the error names the address that is wrong. */
export const emailAddress = z
  .string({ error: 'Enter an e-mail address' })
  .trim()
  .toLowerCase()
  .pipe(z.email({ error: (issue) => `“${String(issue.input)}” is not a valid e-mail address` }).max(254, 'Keep e-mail addresses under 254 characters'));

export const sendReportSchema = z.object({
  to: z
    .array(emailAddress, { error: 'Add at least one recipient' })
    .min(1, 'Add at least one recipient')
    .max(20, 'Send the report to 20 recipients at most')
    .transform((list) => [...new Set(list)]),
  message: z
    .string()
    .trim()
    .max(2000, 'Keep the message under 2000 characters')
    .nullish()
    .transform((s) => (s ? s : null)),
});
export type SendReportInput = z.infer<typeof sendReportSchema>;
