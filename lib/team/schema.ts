import { z } from 'zod';
import { ROLES } from '@/models/User';
import { emailAddress } from '@/lib/reports/schema';

const role = z.enum(ROLES, { error: 'Choose engineer, producer or manager' });

export const inviteSchema = z.object({
  email: emailAddress,
  name: z.string({ error: 'Enter the person’s name' }).trim().min(1, 'Enter the person’s name').max(160, 'Keep the name under 160 characters'),
  role,
});
export type InviteInput = z.infer<typeof inviteSchema>;

export const updateUserSchema = z
  .object({ role: role.optional(), active: z.boolean({ error: 'Active must be true or false' }).optional() })
  .refine((v) => v.role !== undefined || v.active !== undefined, { message: 'Change the role or the active state', path: ['_'] });
export type UpdateUserInput = z.infer<typeof updateUserSchema>;

export const PASSWORD_MIN = 10;

const newPassword = z
  .string({ error: 'Choose a password' })
  .min(PASSWORD_MIN, `Use at least ${PASSWORD_MIN} characters`)
  .max(200, 'Keep the password under 200 characters');
const SAME_TWICE = { message: 'The two passwords are not the same', path: ['confirm'] };

export const acceptInvitationSchema = z
  .object({
    token: z.string().regex(/^[A-Za-z0-9_-]{43}$/, 'This invitation link is not complete'),
    password: newPassword,
    confirm: z.string().optional(),
  })
  .refine((v) => v.confirm === undefined || v.confirm === v.password, SAME_TWICE);

export const changePasswordSchema = z
  .object({
    current: z.string({ error: 'Enter your current password' }).min(1, 'Enter your current password').max(200, 'That is not your current password'),
    password: newPassword,
    confirm: z.string({ error: 'Repeat the new password' }),
  })
  .refine((v) => v.confirm === v.password, SAME_TWICE)
  .refine((v) => v.password !== v.current, { message: 'Choose a password other than the current one', path: ['password'] });
export type ChangePasswordInput = z.infer<typeof changePasswordSchema>;
