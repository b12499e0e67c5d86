import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest, isApiError, type ResponseSchema } from '@/lib/api';

/** The signed-in user as `/api/me` answers. */
export interface Me {
  user: { id: string; email: string; name?: string | null | undefined };
  team?: { id: string; name: string } | null | undefined;
  role: string | null;
  permissions: string[];
}

const isObject = (v: unknown): v is Record<string, unknown> =>
  typeof v === 'object' && v !== null && !Array.isArray(v);
const isStr = (v: unknown): v is string => typeof v === 'string';

/**
 * Checks the `/api/me` answer. Written out by hand rather than with zod because this module is
 * part of the shell that loads before the first screen, and zod's core alone is ~14 kB gzip
 * (the shell's size is budgeted, scripts/bundle-budget.ts). Pages use the shared zod schemas.
 */
export const meSchema: ResponseSchema<Me> = {
  safeParse(data) {
    const fail = (path: string, message: string) => ({
      success: false as const,
      error: { issues: [{ code: 'custom' as const, path: path.split('.'), message, input: data }] },
    });
    if (!isObject(data)) return fail('', 'expected an object');
    const { user, team, role, permissions } = data;
    if (!isObject(user) || !isStr(user.id) || !isStr(user.email))
      return fail('user', 'expected { id, email }');
    if (user.name != null && !isStr(user.name)) return fail('user.name', 'expected a string');
    if (team != null && (!isObject(team) || !isStr(team.id) || !isStr(team.name)))
      return fail('team', 'expected { id, name }');
    if (role !== null && !isStr(role)) return fail('role', 'expected a string or null');
    if (permissions !== undefined && (!Array.isArray(permissions) || !permissions.every(isStr)))
      return fail('permissions', 'expected strings');
    const me: Me = {
      user: {
        id: user.id,
        email: user.email,
        name: (user.name as string | null | undefined) ?? null,
      },
      team: team
        ? { id: (team as { id: string }).id, name: (team as { name: string }).name }
        : null,
      role: role as string | null,
      permissions: (permissions as string[] | undefined) ?? [],
    };
    return { success: true as const, data: me };
  },
};

/** The signed-in user, or `null` when signed out (401). */
export async function getMe(signal?: AbortSignal): Promise<Me | null> {
  try {
    return await apiRequest('/me', { schema: meSchema, signal });
  } catch (e) {
    if (isApiError(e) && e.status === 401) return null;
    throw e;
  }
}

export const meQueryKey = ['me'] as const;

export const meQueryOptions = () =>
  queryOptions({ queryKey: meQueryKey, queryFn: ({ signal }) => getMe(signal), staleTime: 60_000 });

export function useMe() {
  return useQuery(meQueryOptions());
}
