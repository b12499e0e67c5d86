import { z } from 'zod';
import type { SpoolCheck } from '@shared/engine';
import type { SpoolDocument } from '@shared/model/spool';
import { spoolStatusSchema } from '@/features/spools/api/spool-schemas';

/** A share link as the spool's list shows it (no token: it is shown once, at creation). */
export const shareSchema = z.object({
  id: z.string(),
  spoolId: z.string(),
  revision: z.number().int(),
  status: spoolStatusSchema,
  name: z.string(),
  createdAt: z.string(),
  expiresAt: z.string(),
  revokedAt: z.string().nullable(),
  active: z.boolean(),
  createdBy: z.object({ id: z.string(), name: z.string() }).nullable(),
});
export type Share = z.infer<typeof shareSchema>;
/** The answer to creating a link: the share plus its URL with the token. */
export const createdShareSchema = shareSchema.extend({ url: z.string() });
export type CreatedShare = z.infer<typeof createdShareSchema>;
export const shareListSchema = z.object({ items: z.array(shareSchema) });

export type ShareState = 'active' | 'expired' | 'revoked';

/** Active, expired or revoked, at `now`. */
export function shareState(
  s: Pick<Share, 'revokedAt' | 'expiresAt'>,
  now = Date.now(),
): ShareState {
  if (s.revokedAt) return 'revoked';
  return new Date(s.expiresAt).getTime() <= now ? 'expired' : 'active';
}

/** GET /api/share/:token (public). */
export const publicShareSchema = z.object({
  spool: z.object({
    name: z.string(),
    line: z.string(),
    revision: z.number().int(),
    status: spoolStatusSchema,
    document: z.custom<SpoolDocument>(
      (v) =>
        typeof v === 'object' &&
        v !== null &&
        Array.isArray((v as { elements?: unknown }).elements),
    ),
  }),
  check: z.custom<SpoolCheck>(
    (v) =>
      typeof v === 'object' && v !== null && Array.isArray((v as { elements?: unknown }).elements),
  ),
  sharedAt: z.string(),
  expiresAt: z.string(),
  sharedBy: z.string().nullish(),
});
export type PublicShare = z.infer<typeof publicShareSchema>;

export const shareKeys = {
  list: (spoolId: string) => ['spools', 'shares', spoolId] as const,
  public: (token: string) => ['share', token] as const,
};
