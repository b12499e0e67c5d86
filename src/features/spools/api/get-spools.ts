import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api';
import { spoolKeys, spoolPageSchema, type SpoolPage, type SpoolStatus } from './spool-schemas';

export interface SpoolListParams {
  readonly search?: string;
  readonly status?: SpoolStatus;
  /** Field name, prefixed with `-` for descending, e.g. `-updatedAt`. */
  readonly sort?: string;
  readonly page?: number;
  readonly pageSize?: number;
}

export function getSpools(params: SpoolListParams, signal?: AbortSignal): Promise<SpoolPage> {
  return apiRequest('/spools', { query: { ...params }, schema: spoolPageSchema, signal });
}

export const spoolsQueryOptions = (params: SpoolListParams) =>
  queryOptions({
    queryKey: spoolKeys.list(params),
    queryFn: ({ signal }) => getSpools(params, signal),
    placeholderData: keepPreviousData,
  });

export function useSpools(params: SpoolListParams) {
  return useQuery(spoolsQueryOptions(params));
}
