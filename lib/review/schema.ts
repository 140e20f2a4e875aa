import { z } from 'zod';

const note = z.string().trim().max(2000, 'Keep the note under 2000 characters');

/**
 * A producer's decision on a take, shared by the decision form and the API.
 * Rejecting needs a reason (the engineer has to know what to fix); approving
 * takes an optional note; `pending` reopens a decided take.
 */
export const decisionSchema = z
  .object({
    decision: z.enum(['approved', 'rejected', 'pending'], { error: 'Choose approve, reject or reopen' }),
    note: note.optional().nullable(),
  })
  .superRefine((value, ctx) => {
    if (value.decision === 'rejected' && !value.note) {
      ctx.addIssue({ code: 'custom', path: ['note'], message: 'Say why the take is rejected, so the engineer knows what to fix' });
    }
  })
  .transform((value) => ({ decision: value.decision, note: value.note ? value.note : null }));
export type DecisionInput = z.infer<typeof decisionSchema>;

/** A time-stamped comment on a take ("door slam at 02:14"). */
export const commentSchema = z.object({
  atSec: z.number({ error: 'Give the time the comment is about' }).min(0, 'The time cannot be before the start of the take').max(86_400 * 2, 'That time is past the end of any take'),
  body: z.string().trim().min(1, 'Write the comment').max(2000, 'Keep the comment under 2000 characters'),
});
export type CommentInput = z.infer<typeof commentSchema>;

/** `?download=1` asks for the audio as a file to save; anything else plays it in place. */
export const audioQuerySchema = z.object({
  download: z.string().optional().transform((v) => v === '1'),
});

/** The zoom request of the peaks route: about how many buckets the view wants. */
export const peaksQuerySchema = z.object({
  buckets: z.coerce.number().int('Ask for a whole number of buckets').min(16, 'Ask for at least 16 buckets').max(200_000, 'Ask for at most 200000 buckets').default(4000),
});
