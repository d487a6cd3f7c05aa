import { z } from 'zod';
import './messages';
import { ROLES } from '../permissions';
import { LENGTH_UNITS } from '../units';

export const emailSchema = z
  .string({ error: 'Enter your e-mail address' })
  .trim()
  .toLowerCase()
  .min(1, 'Enter your e-mail address')
  .max(254, 'That e-mail address is too long')
  .pipe(z.email({ error: 'Enter an e-mail address like name@example.com' }));

// bcrypt reads at most 72 bytes; a longer password would be silently cut, so refuse it.
export const passwordSchema = z
  .string({ error: 'Enter a password' })
  .min(10, 'Use at least 10 characters')
  .refine((value) => new TextEncoder().encode(value).length <= 72, 'Use at most 72 bytes (bcrypt ignores the rest)');

export const nameSchema = z.string({ error: 'Enter your name' }).trim().min(1, 'Enter your name').max(80, 'Use at most 80 characters');

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string({ error: 'Enter your password' }).min(1, 'Enter your password').max(200),
});
export type SignInInput = z.infer<typeof signInSchema>;

export const signUpSchema = z.object({
  name: nameSchema,
  email: emailSchema,
  password: passwordSchema,
});
export type SignUpInput = z.infer<typeof signUpSchema>;

export const resetRequestSchema = z.object({ email: emailSchema });
export type ResetRequestInput = z.infer<typeof resetRequestSchema>;

export const tokenParamSchema = z.object({
  token: z.string().regex(/^[A-Za-z0-9_-]{20,100}$/, 'That link is not valid'),
});

export const resetPasswordSchema = z.object({ password: passwordSchema });
export type ResetPasswordInput = z.infer<typeof resetPasswordSchema>;

export const acceptInviteSchema = z.object({
  // Only needed when the invited e-mail has no account yet.
  name: nameSchema.optional(),
  password: passwordSchema.optional(),
});
export type AcceptInviteInput = z.infer<typeof acceptInviteSchema>;

export const updateAccountSchema = z.object({
  name: nameSchema.optional(),
  unit: z.enum(LENGTH_UNITS as ['in', 'mm']).optional(),
});
export type UpdateAccountInput = z.infer<typeof updateAccountSchema>;

export const changePasswordSchema = z.object({
  currentPassword: z.string().min(1, 'Enter your current password'),
  newPassword: passwordSchema,
});
export type ChangePasswordInput = z.infer<typeof changePasswordSchema>;

const membershipSummarySchema = z.object({
  teamId: z.string(),
  teamName: z.string(),
  role: z.enum(ROLES),
  personal: z.boolean(),
});

export const meSchema = z.object({
  user: z.object({
    id: z.string(),
    email: z.string(),
    name: z.string(),
    unit: z.enum(['in', 'mm']),
  }),
  teams: z.array(membershipSummarySchema),
  activeTeamId: z.string().nullable(),
  csrfToken: z.string(),
  /** When a session ends: after this long unused, and this long after signing in. */
  sessionLimits: z.object({ idleSeconds: z.number(), absoluteSeconds: z.number() }),
});
export type Me = z.infer<typeof meSchema>;
