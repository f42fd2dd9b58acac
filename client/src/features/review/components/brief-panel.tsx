/** Issuing a master's brief link by e-mail, and the links already issued (with revoke). */
import { useState, type FormEvent } from 'react';
import type { BriefLink } from '@shared/api/review';
import { BRIEFABLE_STATUSES, type SurveyStatus } from '@shared/review/status';
import { useIssueBrief, useRevokeBrief } from '../api/briefs';
import { buttonClass } from '@client/components/ui/button';
import { inputCls } from '@client/components/ui/fields';
import { formatUtc } from '@shared/review/time-words';
import { EmailText } from '@client/components/ui/email-text';
import { Link } from 'react-router';
import { paths } from '@client/config/paths';
import { useDevMailbox } from '@client/lib/dev-mailbox';

const when = formatUtc;

const EXPIRY_CHOICES = [
  { hours: 12, label: '12 hours' },
  { hours: 24, label: '1 day' },
  { hours: 72, label: '3 days' },
  { hours: 168, label: '7 days' },
  { hours: 720, label: '30 days' },
];

export function BriefPanel({ surveyId, status, briefs, canIssue, canRevoke }: { surveyId: string; status: SurveyStatus; briefs: BriefLink[]; canIssue: boolean; canRevoke: boolean }) {
  const issue = useIssueBrief(surveyId);
  const revoke = useRevokeBrief(surveyId);
  const [email, setEmail] = useState('');
  const [hours, setHours] = useState(72);
  const [units, setUnits] = useState<'si' | 'us'>('si');
  const briefable = BRIEFABLE_STATUSES.includes(status);
  const devMailbox = useDevMailbox(issue.isSuccess);

  const submit = (e: FormEvent) => {
    e.preventDefault();
    issue.mutate({ recipientEmail: email.trim(), expiresInHours: hours, units }, { onSuccess: () => setEmail('') });
  };

  return (
    <section aria-labelledby="brief-h" className="rounded-lg border border-line bg-card p-3">
      <h2 id="brief-h" className="text-lg">
        Master’s brief
      </h2>
      <p className="mt-1 text-sm text-ink-soft">A read-only page for the master, sent by e-mail. Nothing else can be reached through the link.</p>
      {canIssue && !briefable && <p className="mt-2 text-sm">A brief can be sent once the survey is under review or accepted.</p>}
      {canIssue && briefable && (
        <form onSubmit={submit} className="mt-2 flex flex-col gap-2" data-testid="brief-form">
          <label className="text-sm font-bold" htmlFor="brief-email">
            Master’s e-mail
          </label>
          <input id="brief-email" type="email" className={inputCls} value={email} onChange={(e) => setEmail(e.target.value)} required autoComplete="off" />
          <label className="text-sm font-bold" htmlFor="brief-expiry">
            Link works for
          </label>
          <select id="brief-expiry" className={inputCls} value={hours} onChange={(e) => setHours(Number(e.target.value))}>
            {EXPIRY_CHOICES.map((c) => (
              <option key={c.hours} value={c.hours}>
                {c.label}
              </option>
            ))}
          </select>
          <fieldset className="flex flex-wrap gap-4">
            <legend className="text-sm font-bold">Units for the master</legend>
            <label className="flex min-h-touch items-center gap-2">
              <input type="radio" name="brief-units" checked={units === 'si'} onChange={() => setUnits('si')} /> SI (m, kPa, kN, t)
            </label>
            <label className="flex min-h-touch items-center gap-2">
              <input type="radio" name="brief-units" checked={units === 'us'} onChange={() => setUnits('us')} /> US (ft, psi, kip, LT)
            </label>
          </fieldset>
          <button type="submit" className={buttonClass('primary', 'self-start')} disabled={issue.isPending}>
            Send brief link
          </button>
          {issue.isSuccess && (
            <p className="rounded border-2 border-ok bg-ok-soft p-2 text-sm" data-testid="brief-sent">
              Sent to {issue.data.link.recipientEmail}. The link is shown only now:{' '}
              <a className="break-all font-mono" href={issue.data.url} target="_blank" rel="noreferrer noopener" data-testid="brief-url">
                {issue.data.url}
              </a>
              {devMailbox && (
                <>
                  {' '}
                  On this development server the e-mail itself is in the{' '}
                  <Link className="font-bold underline" to={paths.devMail}>
                    development mailbox
                  </Link>
                  .
                </>
              )}
            </p>
          )}
          {issue.isError && <p role="alert" className="text-danger">{issue.error.message}</p>}
        </form>
      )}
      {briefs.length > 0 && (
        <ul className="mt-3 space-y-2" data-testid="brief-list">
          {briefs.map((b) => {
            const expired = new Date(b.expiresAt).getTime() < Date.now();
            const state = b.revokedAt ? 'withdrawn' : expired ? 'expired' : 'active';
            return (
              <li key={b.id} className="rounded border border-line p-2 text-sm" data-state={state}>
                <p className="font-bold">
                  <EmailText email={b.recipientEmail} />
                </p>
                <p className="text-ink-soft">
                  {state === 'withdrawn' ? `Withdrawn ${when(b.revokedAt!)}` : state === 'expired' ? `Expired ${when(b.expiresAt)}` : `Works until ${when(b.expiresAt)}`} · {b.units.toUpperCase()} · sent
                  by {b.createdByName} · opened {b.openings} {b.openings === 1 ? 'time' : 'times'}
                  {b.lastOpenedAt ? ` (last ${when(b.lastOpenedAt)})` : ''}
                </p>
                {b.acknowledgement ? (
                  <p className="mt-1 font-bold text-ok" data-testid="brief-acknowledged">
                    Received and understood: {b.acknowledgement.name}, {when(b.acknowledgement.at)} (revision {b.acknowledgement.revision})
                  </p>
                ) : (
                  <p className="mt-1 text-ink-soft">Not acknowledged yet.</p>
                )}
                {state === 'active' && canRevoke && (
                  <button type="button" className={buttonClass('danger-outline', 'mt-1')} onClick={() => revoke.mutate(b.id)} disabled={revoke.isPending}>
                    Withdraw link
                  </button>
                )}
              </li>
            );
          })}
        </ul>
      )}
    </section>
  );
}
