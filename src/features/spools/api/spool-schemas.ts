import { z } from 'zod';
import type { SpoolDocument } from '@shared/model/spool';

export const SPOOL_STATUSES = ['draft', 'submitted', 'checked', 'released'] as const;
export const spoolStatusSchema = z.enum(SPOOL_STATUSES);
export type SpoolStatus = z.infer<typeof spoolStatusSchema>;

export const CHECK_STATUSES = ['pass', 'marginal', 'fail', 'review', 'invalid'] as const;

const countSchema = z.number().int().nonnegative().catch(0);
export const checkSummarySchema = z.object({
  pass: countSchema,
  marginal: countSchema,
  fail: countSchema,
  review: countSchema,
  invalid: countSchema,
});

export const spoolSummarySchema = z.object({
  id: z.string(),
  name: z.string().nullish(),
  line: z.string().nullish(),
  status: spoolStatusSchema,
  revision: z.number().int(),
  version: z.number().int(),
  worst: z.object({ elementId: z.string(), status: z.enum(CHECK_STATUSES) }).nullish(),
  summary: checkSummarySchema.nullish(),
  updatedAt: z.string(),
});
export type SpoolSummary = z.infer<typeof spoolSummarySchema>;

/**
 * The stored document is validated by the server on write; here it is only checked to be an
 * object so a document written by a newer client still opens (the store validates on edit).
 */
const storedDocumentSchema = z.custom<SpoolDocument>(
  (v) =>
    typeof v === 'object' && v !== null && Array.isArray((v as { elements?: unknown }).elements),
  'document must be a spool document',
);

export const spoolSchema = spoolSummarySchema.extend({
  document: storedDocumentSchema,
  createdBy: z.unknown().optional(),
  updatedBy: z.unknown().optional(),
});
export type Spool = z.infer<typeof spoolSchema>;

export const spoolPageSchema = z.object({
  items: z.array(spoolSummarySchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});
export type SpoolPage = z.infer<typeof spoolPageSchema>;

export const spoolKeys = {
  all: ['spools'] as const,
  lists: () => [...spoolKeys.all, 'list'] as const,
  list: (params: object) => [...spoolKeys.lists(), params] as const,
  detail: (id: string) => [...spoolKeys.all, 'detail', id] as const,
  revisions: (id: string) => [...spoolKeys.all, 'revisions', id] as const,
};
