/** The admin's actions on one member: change role, deactivate, reactivate, resend the invitation. */
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Member } from '@shared/api/auth';
import type { Role } from '@shared/api/roles';
import { api, jsonBody } from '@client/lib/api-client';
import { memberKeys } from './keys';

export type MemberAction =
  | { kind: 'role'; userId: string; role: Role }
  | { kind: 'deactivate' | 'reactivate' | 'resend-invitation'; userId: string };

export function updateMember(action: MemberAction): Promise<Member> {
  const base = `/api/members/${encodeURIComponent(action.userId)}`;
  if (action.kind === 'role') return api<Member>(base, { method: 'PATCH', ...jsonBody({ role: action.role }) });
  return api<Member>(`${base}/${action.kind}`, { method: 'POST' });
}

export function useUpdateMember() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: updateMember, onSettled: () => qc.invalidateQueries({ queryKey: memberKeys.all }), networkMode: 'always' });
}
