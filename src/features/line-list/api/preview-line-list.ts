import { useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import { apiRequest } from '@/lib/api';

const csvIssueSchema = z.object({
  line: z.number().nullable(),
  column: z.string().nullable(),
  path: z.string(),
  message: z.string(),
});

const previewSchema = z.object({
  ok: z.boolean(),
  issues: z.array(csvIssueSchema),
  items: z.array(
    z.object({
      line: z.number().nullable(),
      name: z.string(),
      pipeLine: z.string(),
      units: z.enum(['imperial', 'metric']),
      conditions: z.record(z.string(), z.unknown()),
    }),
  ),
  rows: z.number().optional(),
});
export type LineListPreview = z.infer<typeof previewSchema>;

/** `POST /api/spools/import/preview` (spool:edit): the spools a line-list CSV would create; never writes. */
export function previewLineList(csv: string) {
  return apiRequest('/spools/import/preview', {
    rawBody: { contentType: 'text/csv', text: csv },
    schema: previewSchema,
  });
}

export function usePreviewLineList() {
  return useMutation({ mutationFn: previewLineList });
}
