import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api';
import { invitationSchema, teamKeys } from './team-schemas';

/** `DELETE /api/team/invitations/:id`: the link stops working. */
export function withdrawInvitation(id: string) {
  return apiRequest(`/team/invitations/${encodeURIComponent(id)}`, {
    method: 'DELETE',
    schema: invitationSchema,
  });
}

export function useWithdrawInvitation() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: withdrawInvitation,
    onSuccess: () => qc.invalidateQueries({ queryKey: teamKeys.invitations() }),
  });
}
