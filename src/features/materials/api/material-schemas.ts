import { z } from 'zod';

export const csvIssueSchema = z.object({
  line: z.number().nullable(),
  column: z.string().nullable(),
  path: z.string(),
  message: z.string(),
});

/**
 * What a change to the team library says about the re-check of the team's spools: the id of
 * the background job that re-checks them (`recheckJob`, polled by use-recheck-status.ts), or a
 * final count (`rechecked`).
 */
export const recheckFieldsSchema = z.object({
  rechecked: z.number().int().nonnegative().optional(),
  recheckJob: z.object({ id: z.string() }).loose().optional(),
});
export type RecheckFields = z.infer<typeof recheckFieldsSchema>;
