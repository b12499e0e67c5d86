/**
 * Team administration inputs shared by the server routes and the admin forms: inviting a
 * member, choosing a password (invitation and password reset), and changing a role.
 */
import { z } from 'zod';
import { ROLES } from './permissions';

/** Password length limits (better-auth is configured with the same numbers). */
export const MIN_PASSWORD_LENGTH = 10;
export const MAX_PASSWORD_LENGTH = 128;

/** Days an invitation link stays usable. */
export const INVITATION_DAYS = 7;

export const roleSchema = z.enum(ROLES, {
  error: 'must be one of designer, checker, fabricator, lead, admin',
});

export const passwordSchema = z
  .string({ error: 'is required' })
  .min(MIN_PASSWORD_LENGTH, `must be at least ${MIN_PASSWORD_LENGTH} characters`)
  .max(MAX_PASSWORD_LENGTH, `must be at most ${MAX_PASSWORD_LENGTH} characters`);

export const inviteMemberSchema = z.object({
  name: z
    .string({ error: 'is required' })
    .trim()
    .min(1, 'must not be empty')
    .max(120, 'must be at most 120 characters'),
  email: z
    .string({ error: 'is required' })
    .trim()
    .max(200, 'must be at most 200 characters')
    .pipe(z.email({ error: 'must be an e-mail address' })),
  role: roleSchema,
});
export type InviteMemberInput = z.infer<typeof inviteMemberSchema>;

export const changeRoleSchema = z.object({ role: roleSchema });

/** A new password typed twice; `confirm` must match. */
export const newPasswordSchema = z
  .object({ password: passwordSchema, confirm: z.string() })
  .refine((v) => v.password === v.confirm, {
    path: ['confirm'],
    message: 'does not match the password',
  });
export type NewPasswordInput = z.infer<typeof newPasswordSchema>;

export const acceptInvitationSchema = z.object({
  token: z
    .string({ error: 'is required' })
    .min(16, 'is not a valid invitation token')
    .max(200, 'is not a valid invitation token'),
  password: passwordSchema,
});
