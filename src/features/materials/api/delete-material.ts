import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiRequest } from '@/lib/api';
import { materialsQueryOptions } from '@/features/sketch/api/get-materials';
import { recheckFieldsSchema } from './material-schemas';

const deletedSchema = recheckFieldsSchema.extend({ deleted: z.string() });

/** `DELETE /api/materials/:id` (admin): a team material; a built-in row it replaced applies again. */
export function deleteMaterial(id: string) {
  return apiRequest(`/materials/${encodeURIComponent(id)}`, {
    method: 'DELETE',
    schema: deletedSchema,
  });
}

export function useDeleteMaterial() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: deleteMaterial,
    onSuccess: () => qc.invalidateQueries({ queryKey: materialsQueryOptions().queryKey }),
  });
}
