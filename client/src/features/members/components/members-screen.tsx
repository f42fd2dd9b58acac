import { useCallback, useState } from 'react';
import { useSession } from '@client/lib/session';
import { OfflineError } from '@client/lib/api-client';
import { FormAlert } from '@client/components/ui/form-field';
import { useMembers } from '../api/get-members';
import { useUpdateMember, type MemberAction } from '../api/update-member';
import { InviteForm } from './invite-form';
import { MembersTable } from './members-table';

const done: Record<MemberAction['kind'], string> = {
  role: 'Role changed.',
  deactivate: 'Deactivated.',
  reactivate: 'Reactivated.',
  'resend-invitation': 'A new invitation link is on its way; the old one no longer works.',
};

/** The admin's screen: who belongs to the organisation, with what role, and invitations. */
export function MembersScreen() {
  const { user } = useSession();
  const members = useMembers();
  const update = useUpdateMember();
  const [busyId, setBusyId] = useState<string | null>(null);
  const [message, setMessage] = useState<{ tone: 'ok' | 'danger'; text: string } | null>(null);

  const onAction = useCallback(
    (action: MemberAction) => {
      setBusyId(action.userId);
      setMessage(null);
      update.mutate(action, {
        onSuccess: (m) => setMessage({ tone: 'ok', text: `${m.name || m.email}: ${done[action.kind]}` }),
        onError: (err) => setMessage({ tone: 'danger', text: err instanceof OfflineError ? 'No connection: member changes need the network.' : err.message }),
        onSettled: () => setBusyId(null),
      });
    },
    [update],
  );

  return (
    <main className="mx-auto max-w-6xl space-y-4 p-3 sm:p-6">
      <div>
        <h1 className="text-3xl">Members</h1>
        {user && <p className="text-ink-soft">Everyone in {user.organisation.name}: their role, and who is still to join.</p>}
      </div>
      <InviteForm />
      {message && <FormAlert tone={message.tone}>{message.text}</FormAlert>}
      {members.isPending && <p role="status">Loading members…</p>}
      {members.isError && <FormAlert>{members.error.message}</FormAlert>}
      {members.data && user && <MembersTable members={members.data.members} selfId={user.id} busyId={busyId} onAction={onAction} />}
      <p className="text-sm text-ink-soft">
        Surveyors create and submit surveys. Engineers also review them and issue briefs. Admins manage members and see every survey
        of the organisation.
      </p>
    </main>
  );
}
