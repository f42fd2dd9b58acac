import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InviteMemberRequest, Member } from '@shared/api/auth';
import { api, jsonBody } from '@client/lib/api-client';
import { memberKeys } from './keys';

export const inviteMember = (body: InviteMemberRequest) => api<Member>('/api/members/invitations', { method: 'POST', ...jsonBody(body) });

export function useInviteMember() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: inviteMember, onSuccess: () => qc.invalidateQueries({ queryKey: memberKeys.all }), networkMode: 'always' });
}
