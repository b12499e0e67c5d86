import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import type { TeamMaterialInput } from '@shared/model/team-material';
import { apiRequest } from '@/lib/api';
import { materialsQueryOptions } from '@/features/sketch/api/get-materials';
import { recheckFieldsSchema } from './material-schemas';

const addedSchema = recheckFieldsSchema.extend({
  item: z.object({ id: z.string(), name: z.string() }).loose(),
  replaces: z.enum(['library']).nullable(),
});

/** `POST /api/materials` (admin): one team material from the form. */
export function addMaterial(input: TeamMaterialInput) {
  return apiRequest('/materials', { method: 'POST', body: input, schema: addedSchema });
}

export function useAddMaterial() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: addMaterial,
    onSuccess: () => qc.invalidateQueries({ queryKey: materialsQueryOptions().queryKey }),
  });
}
