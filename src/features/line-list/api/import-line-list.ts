import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiRequest } from '@/lib/api';
import { spoolKeys } from '@/features/spools/api/spool-schemas';

const importedSchema = z.object({
  created: z.number(),
  items: z.array(z.object({ id: z.string(), name: z.string() }).loose()),
});

/** `POST /api/spools/import` (spool:edit): one spool per row, all rows or none (422). */
export function importLineList(csv: string) {
  return apiRequest('/spools/import', {
    rawBody: { contentType: 'text/csv', text: csv },
    schema: importedSchema,
  });
}

export function useImportLineList() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: importLineList,
    onSuccess: () => qc.invalidateQueries({ queryKey: spoolKeys.lists() }),
  });
}
