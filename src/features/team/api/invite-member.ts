import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InviteMemberInput } from '@shared/model/team';
import { apiRequest } from '@/lib/api';
import { invitationSchema, teamKeys } from './team-schemas';

/** `POST /api/team/invitations`: mails the person a one-use link to choose their password. */
export function inviteMember(input: InviteMemberInput) {
  return apiRequest('/team/invitations', { method: 'POST', body: input, schema: invitationSchema });
}

export function useInviteMember() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: inviteMember,
    onSuccess: () => qc.invalidateQueries({ queryKey: teamKeys.invitations() }),
  });
}
