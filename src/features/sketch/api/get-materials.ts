import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import type { Material } from '@shared/data/materials';
import { apiRequest } from '@/lib/api';

/**
 * `GET /api/materials`: the library plus the team's own materials (`origin: 'team'`, with the
 * source note they were imported with). Rows are checked for the fields the pickers and the
 * check need; the rest of a row is passed through as the engine's `Material`.
 */
const materialRowSchema = z
  .object({
    id: z.string().min(1),
    spec: z.string(),
    grade: z.string(),
    name: z.string(),
    origin: z.enum(['library', 'team']).catch('library'),
    sourceNote: z.string().nullish(),
    stress: z.array(z.object({ tempF: z.number(), value: z.number() }).loose()),
  })
  .loose();
export type MaterialRow = Material & { origin: 'library' | 'team'; sourceNote?: string | null };

export const materialsSchema = z.object({ items: z.array(materialRowSchema) });

export async function getMaterials(signal?: AbortSignal): Promise<MaterialRow[]> {
  const data = await apiRequest('/materials', { schema: materialsSchema, signal });
  return data.items as unknown as MaterialRow[];
}

export const materialsQueryOptions = () =>
  queryOptions({
    queryKey: ['materials'] as const,
    queryFn: ({ signal }) => getMaterials(signal),
    staleTime: 5 * 60_000,
  });

export function useMaterials() {
  return useQuery(materialsQueryOptions());
}
