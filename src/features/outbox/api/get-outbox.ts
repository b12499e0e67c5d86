import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiRequest } from '@/lib/api';

export const outboxMailSchema = z.object({
  id: z.union([z.number(), z.string()]),
  to: z.string(),
  from: z.string(),
  subject: z.string(),
  text: z.string(),
  createdAt: z.string(),
});
export type OutboxMail = z.infer<typeof outboxMailSchema>;

const outboxSchema = z.object({ items: z.array(outboxMailSchema) });

/**
 * `GET /api/admin/outbox?limit=` (admin): mail caught in development and tests, to the viewer's
 * team, one-use links redacted. 404 when the server sends through a real SMTP server.
 */
export async function getOutbox(limit: number, signal?: AbortSignal) {
  return (await apiRequest('/admin/outbox', { query: { limit }, schema: outboxSchema, signal }))
    .items;
}

export const outboxQueryOptions = (limit: number) =>
  queryOptions({
    queryKey: ['outbox', limit] as const,
    queryFn: ({ signal }) => getOutbox(limit, signal),
  });

export function useOutbox(limit: number) {
  return useQuery(outboxQueryOptions(limit));
}
