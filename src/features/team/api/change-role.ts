import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Role } from '@shared/model/permissions';
import { apiRequest } from '@/lib/api';
import { meQueryKey } from '@/features/auth/api/get-me';
import { memberSchema, teamKeys } from './team-schemas';

/** `PATCH /api/team/members/:userId {role}`; the server refuses to demote the last admin (409). */
export function changeRole(v: { userId: string; role: Role }) {
  return apiRequest(`/team/members/${encodeURIComponent(v.userId)}`, {
    method: 'PATCH',
    body: { role: v.role },
    schema: memberSchema,
  });
}

export function useChangeRole() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: changeRole,
    onSettled: async () => {
      await qc.invalidateQueries({ queryKey: teamKeys.members() });
      await qc.invalidateQueries({ queryKey: meQueryKey });
    },
  });
}
