import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import type { AcceptInvitationRequest, InvitationInfo, SessionResponse } from '@shared/api/auth';
import { api, jsonBody } from '@client/lib/api-client';
import { acceptSession } from '@client/lib/session';

export const authKeys = {
  all: ['auth'] as const,
  invitation: (token: string) => [...authKeys.all, 'invitation', token] as const,
};

export const getInvitation = (token: string) => api<InvitationInfo>(`/api/invitations/${encodeURIComponent(token)}`);

export const invitationQueryOptions = (token: string) =>
  queryOptions({ queryKey: authKeys.invitation(token), queryFn: () => getInvitation(token), retry: false, enabled: token.length > 0 });

export const useInvitation = (token: string) => useQuery(invitationQueryOptions(token));

export const acceptInvitation = ({ token, ...body }: AcceptInvitationRequest & { token: string }) =>
  api<SessionResponse>(`/api/invitations/${encodeURIComponent(token)}/accept`, { method: 'POST', ...jsonBody(body) });

export const useAcceptInvitation = () =>
  useMutation({ mutationFn: acceptInvitation, onSuccess: (session) => acceptSession(session), networkMode: 'always' });
