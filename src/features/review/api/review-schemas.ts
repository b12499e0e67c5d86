import { z } from 'zod';
import {
  checkSummarySchema,
  spoolStatusSchema,
  spoolSummarySchema,
} from '@/features/spools/api/spool-schemas';
import type { SpoolDocument } from '@shared/model/spool';

const userRefSchema = z.object({ id: z.string(), name: z.string() }).nullable();

/** A review comment (GET /api/spools/:id/comments). */
export const commentSchema = z.object({
  id: z.number().int(),
  revision: z.number().int(),
  elementId: z.string().nullable(),
  body: z.string(),
  user: userRefSchema,
  createdAt: z.string(),
  resolvedAt: z.string().nullable(),
  resolvedBy: userRefSchema,
});
export type ReviewComment = z.infer<typeof commentSchema>;
export const commentListSchema = z.object({ items: z.array(commentSchema) });

/** A lifecycle event (GET /api/spools/:id/events). */
export const eventSchema = z.object({
  id: z.number().int(),
  revision: z.number().int(),
  from: spoolStatusSchema,
  to: spoolStatusSchema,
  note: z.string().nullable(),
  user: userRefSchema,
  createdAt: z.string(),
});
export type SpoolEvent = z.infer<typeof eventSchema>;
export const eventListSchema = z.object({ items: z.array(eventSchema) });

const worstSchema = z.object({ elementId: z.string(), status: z.string() }).nullable();

/** A row of GET /api/spools/:id/revisions. */
export const revisionInfoSchema = z.object({
  revision: z.number().int(),
  status: spoolStatusSchema,
  name: z.string(),
  line: z.string(),
  version: z.number().int(),
  current: z.boolean(),
  frozenAt: z.string().nullable(),
  frozenBy: userRefSchema,
  summary: checkSummarySchema,
  worst: worstSchema,
});
export type RevisionInfo = z.infer<typeof revisionInfoSchema>;
export const revisionListSchema = z.object({ items: z.array(revisionInfoSchema) });

const documentSchema = z.custom<SpoolDocument>(
  (v) =>
    typeof v === 'object' && v !== null && Array.isArray((v as { elements?: unknown }).elements),
  'document must be a spool document',
);

/** GET /api/spools/:id/revisions/:rev. */
export const revisionSchema = z.object({
  spoolId: z.string(),
  revision: z.number().int(),
  status: spoolStatusSchema,
  name: z.string(),
  line: z.string(),
  version: z.number().int(),
  current: z.boolean(),
  document: documentSchema,
  summary: checkSummarySchema,
  worst: worstSchema,
  updatedAt: z.string(),
});
export type Revision = z.infer<typeof revisionSchema>;

const waitingCommentSchema = z.object({
  id: z.number().int(),
  revision: z.number().int(),
  elementId: z.string().nullable(),
  body: z.string(),
  createdAt: z.string(),
});

/** GET /api/waiting: the spools waiting on the signed-in member's role. */
export const waitingSchema = z.object({
  role: z.string(),
  state: spoolStatusSchema,
  total: z.number().int(),
  items: z.array(
    z.object({
      spool: spoolSummarySchema,
      openComments: z.number().int(),
      comments: z.array(waitingCommentSchema).optional(),
      since: z.string().nullable(),
      note: z.string().nullable(),
    }),
  ),
});
export type Waiting = z.infer<typeof waitingSchema>;

export const reviewKeys = {
  comments: (id: string) => ['spools', 'comments', id] as const,
  events: (id: string) => ['spools', 'events', id] as const,
  revision: (id: string, rev: number) => ['spools', 'revision', id, rev] as const,
  waiting: () => ['spools', 'waiting'] as const,
};
