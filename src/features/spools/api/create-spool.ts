import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SpoolDocument } from '@shared/model/spool';
import { apiRequest } from '@/lib/api';
import { spoolKeys, spoolSchema, type Spool } from './spool-schemas';

export function createSpool(document: SpoolDocument): Promise<Spool> {
  return apiRequest('/spools', { method: 'POST', body: { document }, schema: spoolSchema });
}

export function useCreateSpool() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createSpool,
    onSuccess: async (spool) => {
      qc.setQueryData(spoolKeys.detail(spool.id), spool);
      await qc.invalidateQueries({ queryKey: spoolKeys.lists() });
    },
  });
}

/** A new, empty spool: carbon steel at modest conditions, ready for the first run. */
export function createBlankDocument(name: string): SpoolDocument {
  return {
    units: 'imperial',
    name,
    line: '',
    conditions: {
      pressure: 150,
      temperature: 100,
      material: 'A106-B',
      productForm: 'seamless',
      corrosionAllowance: 0.0625,
      millTolerance: 0.125,
    },
    defaultBendRadius: { multipleOfD: 1.5 },
    elements: [],
  };
}
