import { SortableHeaderRows } from '@client/components/ui/sortable-header';
import { useMemo, useState } from 'react';
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import { ROLE_LABELS, type Member, type MembershipStatus } from '@shared/api/auth';
import { ROLES, type Role } from '@shared/api/roles';
import { Button } from '@client/components/ui/button';
import type { MemberAction } from '../api/update-member';
import { formatUtc } from '@shared/review/time-words';
import { EmailText } from '@client/components/ui/email-text';

const STATUS: Record<MembershipStatus, { label: string; className: string }> = {
  active: { label: 'Active', className: 'border-ok bg-ok-soft text-ok' },
  invited: { label: 'Invited', className: 'border-caution bg-caution-soft text-caution' },
  deactivated: { label: 'Deactivated', className: 'border-line bg-paper text-ink-soft' },
};

const dateTime = (iso: string | null) =>
  formatUtc(iso);

function StatusChip({ status }: { status: MembershipStatus }) {
  const s = STATUS[status];
  return <span className={`inline-block rounded-full border-2 px-2 text-sm font-bold ${s.className}`}>{s.label}</span>;
}

interface ActionsProps {
  member: Member;
  isSelf: boolean;
  busy: boolean;
  onAction: (a: MemberAction) => void;
}

function RoleSelect({ member, busy, onAction }: ActionsProps) {
  return (
    <select
      aria-label={`Role of ${member.name || member.email}`}
      value={member.role}
      disabled={busy || member.status === 'deactivated'}
      onChange={(e) => onAction({ kind: 'role', userId: member.userId, role: e.target.value as Role })}
      className="min-h-touch rounded-lg border-2 border-line bg-card px-2"
    >
      {ROLES.map((r) => (
        <option key={r} value={r}>
          {ROLE_LABELS[r]}
        </option>
      ))}
    </select>
  );
}

function RowActions({ member, isSelf, busy, onAction }: ActionsProps) {
  const who = member.name || member.email;
  return (
    <div className="flex flex-wrap gap-2">
      {member.status === 'invited' && (
        <Button tone="secondary" disabled={busy} onClick={() => onAction({ kind: 'resend-invitation', userId: member.userId })} aria-label={`Resend invitation to ${who}`}>
          Resend
        </Button>
      )}
      {member.status === 'deactivated' ? (
        <Button tone="secondary" disabled={busy} onClick={() => onAction({ kind: 'reactivate', userId: member.userId })} aria-label={`Reactivate ${who}`}>
          Reactivate
        </Button>
      ) : (
        <Button
          tone="danger-outline"
          disabled={busy}
          aria-label={member.status === 'invited' ? `Withdraw the invitation to ${who}` : `Deactivate ${who}`}
          onClick={() => {
            const text = isSelf
              ? 'Deactivate your own account? You will be signed out everywhere.'
              : member.status === 'invited'
                ? `Withdraw the invitation to ${who}? Their link stops working; “Reactivate” and “Resend” invite them again.`
                : `Deactivate ${who}? They are signed out at once and cannot sign in until reactivated. Their surveys stay with the organisation.`;
            if (window.confirm(text)) onAction({ kind: 'deactivate', userId: member.userId });
          }}
        >
          {/* an invitation not yet taken up is withdrawn, not "deactivated": nobody has an account to stop */}
          {member.status === 'invited' ? 'Withdraw' : 'Deactivate'}
        </Button>
      )}
    </div>
  );
}

const col = createColumnHelper<Member>();

export function MembersTable({
  members,
  selfId,
  busyId,
  onAction,
}: {
  members: Member[];
  selfId: string;
  busyId: string | null;
  onAction: (a: MemberAction) => void;
}) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const columns = useMemo(
    () => [
      col.accessor((m) => m.name || m.email, {
        id: 'name',
        header: 'Name',
        cell: (c) => (
          <span className="font-bold">
            {c.row.original.name || <em className="font-normal text-ink-soft">not yet chosen</em>}
            {c.row.original.userId === selfId && <span className="font-normal text-ink-soft"> (you)</span>}
          </span>
        ),
      }),
      col.accessor('email', { header: 'E-mail', cell: (c) => <EmailText email={c.getValue()} /> }),
      col.accessor('role', {
        header: 'Role',
        cell: (c) => <RoleSelect member={c.row.original} isSelf={c.row.original.userId === selfId} busy={busyId === c.row.original.userId} onAction={onAction} />,
      }),
      col.accessor('status', { header: 'Status', cell: (c) => <StatusChip status={c.getValue()} /> }),
      col.accessor('lastSignInAt', {
        header: 'Last sign-in',
        sortUndefined: 'last',
        cell: (c) => (c.row.original.status === 'invited' ? `Link expires ${dateTime(c.row.original.invitationExpiresAt)}` : dateTime(c.getValue())),
      }),
      col.display({
        id: 'actions',
        header: () => <span className="sr-only">Actions</span>,
        cell: (c) => <RowActions member={c.row.original} isSelf={c.row.original.userId === selfId} busy={busyId === c.row.original.userId} onAction={onAction} />,
      }),
    ],
    [selfId, busyId, onAction],
  );
  const table = useReactTable({
    data: members,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getRowId: (m) => m.userId,
  });
  const rows = table.getRowModel().rows;

  return (
    <>
      {/* Wide screens: a table. */}
      <table className="hidden w-full border-collapse overflow-hidden rounded-xl border border-line bg-card text-left lg:table" aria-label="Members">
        <thead className="bg-paper">
          <SortableHeaderRows table={table} cellClassName="border-b border-line p-0" />
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.id} className="border-b border-line last:border-0" data-testid="member-row">
              {r.getVisibleCells().map((cell) => (
                <td key={cell.id} className="px-3 py-2 align-middle">
                  {flexRender(cell.column.columnDef.cell, cell.getContext())}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>

      {/* Phones and tablets: one card per member, the same rows. */}
      <ul className="space-y-3 lg:hidden" aria-label="Members">
        {rows.map((r) => {
          const m = r.original;
          const isSelf = m.userId === selfId;
          const busy = busyId === m.userId;
          return (
            <li key={r.id} className="rounded-xl border border-line bg-card p-3" data-testid="member-card">
              <div className="flex flex-wrap items-start justify-between gap-2">
                <div className="min-w-0">
                  <p className="font-bold">
                    {m.name || <em className="font-normal text-ink-soft">name not yet chosen</em>}
                    {isSelf && <span className="font-normal text-ink-soft"> (you)</span>}
                  </p>
                  <p className="text-ink-soft">
                    <EmailText email={m.email} />
                  </p>
                </div>
                <StatusChip status={m.status} />
              </div>
              <p className="mt-1 text-sm text-ink-soft">
                {m.status === 'invited' ? `Link expires ${dateTime(m.invitationExpiresAt)}` : `Last sign-in: ${dateTime(m.lastSignInAt)}`}
              </p>
              <div className="mt-2 flex flex-wrap items-center gap-2">
                <RoleSelect member={m} isSelf={isSelf} busy={busy} onAction={onAction} />
                <RowActions member={m} isSelf={isSelf} busy={busy} onAction={onAction} />
              </div>
            </li>
          );
        })}
      </ul>
    </>
  );
}
