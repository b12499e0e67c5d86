import { useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import { apiRequest } from '@/lib/api';
import { csvIssueSchema } from './material-schemas';

const previewSchema = z.object({
  ok: z.boolean(),
  issues: z.array(csvIssueSchema),
  items: z.array(
    z.object({
      id: z.string(),
      spec: z.string(),
      grade: z.string(),
      name: z.string(),
      rows: z.number(),
      minTempF: z.number().nullable(),
      maxTempF: z.number().nullable(),
      fromMemory: z.boolean(),
      replaces: z.enum(['team', 'library']).nullable(),
    }),
  ),
});
export type MaterialsPreview = z.infer<typeof previewSchema>;

/** `POST /api/materials/import/preview?source=` (admin): a dry run of the CSV; never writes. */
export function previewMaterialsCsv(v: { csv: string; source: string }) {
  return apiRequest('/materials/import/preview', {
    query: { source: v.source },
    rawBody: { contentType: 'text/csv', text: v.csv },
    schema: previewSchema,
  });
}

export function usePreviewMaterialsCsv() {
  return useMutation({ mutationFn: previewMaterialsCsv });
}
