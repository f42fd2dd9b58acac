import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { InviteMemberRequestSchema, ROLE_LABELS } from '@shared/api/auth';
import { ROLES } from '@shared/api/roles';
import { ApiError, OfflineError } from '@client/lib/api-client';
import { Button } from '@client/components/ui/button';
import { FormAlert, TextField } from '@client/components/ui/form-field';
import { useInviteMember } from '../api/invite-member';

type Input = z.input<typeof InviteMemberRequestSchema>;
type Output = z.output<typeof InviteMemberRequestSchema>;

export function InviteForm() {
  const invite = useInviteMember();
  const [result, setResult] = useState<{ tone: 'ok' | 'danger'; text: string } | null>(null);
  const form = useForm<Input, unknown, Output>({ resolver: zodResolver(InviteMemberRequestSchema), defaultValues: { email: '', role: 'surveyor' } });
  const { errors, isSubmitting } = form.formState;

  const submit = form.handleSubmit(async (values) => {
    setResult(null);
    try {
      const m = await invite.mutateAsync(values);
      setResult({ tone: 'ok', text: `Invitation sent to ${m.email}. The link works for 7 days.` });
      form.reset({ email: '', role: values.role });
    } catch (err) {
      if (err instanceof ApiError && Array.isArray(err.details)) {
        for (const d of err.details as Array<{ path: string; message: string }>) {
          if (d.path === 'email' || d.path === 'role') form.setError(d.path, { message: d.message });
        }
      }
      setResult({ tone: 'danger', text: err instanceof OfflineError ? 'No connection: invitations need the network.' : (err as Error).message });
    }
  });

  return (
    <form onSubmit={submit} noValidate aria-label="Invite a member" className="rounded-xl border border-line bg-card p-4">
      <h2 className="text-xl">Invite someone</h2>
      <p className="text-ink-soft">They get an e-mail with a link to choose their name and password.</p>
      {result && (
        <div className="mt-3">
          <FormAlert tone={result.tone}>{result.text}</FormAlert>
        </div>
      )}
      <div className="mt-3 flex flex-col gap-3 sm:flex-row sm:items-end">
        <TextField className="flex-1" label="E-mail" type="email" inputMode="email" autoComplete="off" error={errors.email?.message} {...form.register('email')} />
        <div>
          <label htmlFor="invite-role" className="block font-bold">
            Role
          </label>
          <select id="invite-role" className="mt-1 block min-h-touch w-full rounded-lg border-2 border-line bg-card px-3 text-lg sm:w-44" {...form.register('role')}>
            {ROLES.map((r) => (
              <option key={r} value={r}>
                {ROLE_LABELS[r]}
              </option>
            ))}
          </select>
          {errors.role && <p className="mt-1 text-sm font-bold text-danger">{errors.role.message}</p>}
        </div>
        <Button type="submit" disabled={isSubmitting}>
          {isSubmitting ? 'Sending…' : 'Send invitation'}
        </Button>
      </div>
    </form>
  );
}
