import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiRequest } from '@/lib/api';
import { materialsQueryOptions } from '@/features/sketch/api/get-materials';
import { recheckFieldsSchema } from './material-schemas';

const importedSchema = recheckFieldsSchema.extend({ imported: z.number() });

/** `POST /api/materials/import?source=` (admin): writes every material of the CSV, or none (422). */
export function importMaterialsCsv(v: { csv: string; source: string }) {
  return apiRequest('/materials/import', {
    query: { source: v.source },
    rawBody: { contentType: 'text/csv', text: v.csv },
    schema: importedSchema,
  });
}

export function useImportMaterialsCsv() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: importMaterialsCsv,
    onSuccess: () => qc.invalidateQueries({ queryKey: materialsQueryOptions().queryKey }),
  });
}
