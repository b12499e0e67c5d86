import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api';
import { teamKeys } from './team-schemas';

/** `DELETE /api/team/members/:userId`; the server refuses to remove the last admin (409). */
export function removeMember(userId: string) {
  return apiRequest(`/team/members/${encodeURIComponent(userId)}`, { method: 'DELETE' });
}

export function useRemoveMember() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: removeMember,
    onSettled: () => qc.invalidateQueries({ queryKey: teamKeys.members() }),
  });
}
