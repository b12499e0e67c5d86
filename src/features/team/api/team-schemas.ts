import { z } from 'zod';

/** Shapes of the /api/team answers, shared by the member and invitation endpoint files. */
export const memberSchema = z.object({
  userId: z.string(),
  email: z.string(),
  name: z.string(),
  role: z.string(),
  createdAt: z.string().optional(),
});
export type Member = z.infer<typeof memberSchema>;

export const invitationSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  role: z.string(),
  state: z.enum(['pending', 'accepted', 'expired', 'revoked']),
  createdAt: z.string(),
  expiresAt: z.string(),
  acceptedAt: z.string().nullable(),
  revokedAt: z.string().nullable(),
  invitedBy: z.string().nullable(),
});
export type Invitation = z.infer<typeof invitationSchema>;

export const teamKeys = {
  all: ['team'] as const,
  members: () => [...teamKeys.all, 'members'] as const,
  invitations: () => [...teamKeys.all, 'invitations'] as const,
};
