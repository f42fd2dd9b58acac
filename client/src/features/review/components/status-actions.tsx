/** The survey's status and the moves the viewer may make from it. */
import { useState } from 'react';
import type { Role } from '@shared/api/roles';
import type { StatusEvent } from '@shared/api/review';
import { STATUS_LABELS, transitionsFor, type SurveyStatus } from '@shared/review/status';
import { useChangeStatus } from '../api/change-status';
import { StatusChip } from './status-chip';
import { buttonClass } from '@client/components/ui/button';
import { inputCls } from '@client/components/ui/fields';
import { formatUtc } from '@shared/review/time-words';

const when = formatUtc;

export function StatusActions({
  surveyId,
  status,
  role,
  events,
  isSubmitter,
  overCapacity = [],
}: {
  surveyId: string;
  status: SurveyStatus;
  role: Role;
  events: StatusEvent[];
  isSubmitter: boolean;
  /** Names of boundaries over capacity in the server's results: accepting asks first, naming them. */
  overCapacity?: string[];
}) {
  const change = useChangeStatus(surveyId);
  const [note, setNote] = useState('');
  const [confirmAccept, setConfirmAccept] = useState(false);
  const move = (to: SurveyStatus) => change.mutate({ to, note: note || undefined }, { onSuccess: () => setNote('') });
  const moves = transitionsFor(status, role).filter((t) => !(t.notBySubmitter && isSubmitter));
  return (
    <section aria-labelledby="status-h" className="rounded-lg border border-line bg-card p-3">
      <h2 id="status-h" className="flex flex-wrap items-center gap-2 text-lg">
        Status <StatusChip status={status} />
      </h2>
      {moves.length > 0 && (
        <div className="mt-2 flex flex-col gap-2">
          <label className="text-sm font-bold" htmlFor="status-note">
            Note to the surveyor {moves.some((m) => m.noteRequired) ? '(needed to return or reopen)' : '(optional)'}
          </label>
          <textarea id="status-note" className={`${inputCls} py-2`} rows={2} value={note} onChange={(e) => setNote(e.target.value)} />
          <div className="flex flex-wrap gap-2">
            {moves.map((t) => (
              <button
                key={t.action + t.to}
                type="button"
                className={buttonClass(t.action === 'return' ? 'danger-outline' : 'primary')}
                disabled={change.isPending}
                onClick={() => (t.to === 'accepted' && overCapacity.length > 0 ? setConfirmAccept(true) : move(t.to))}
              >
                {t.label}
              </button>
            ))}
          </div>
          {confirmAccept && (
            <div className="rounded-md border-2 border-danger bg-danger-soft p-2" role="alertdialog" aria-labelledby="accept-over-h" data-testid="accept-over-capacity">
              <p id="accept-over-h" className="font-bold">
                <span aria-hidden="true">▲ </span>
                {overCapacity.length === 1 ? 'This boundary is' : `These ${overCapacity.length} boundaries are`} OVER CAPACITY: {overCapacity.join(', ')}. Accept the survey all the same?
              </p>
              <div className="mt-2 flex flex-wrap gap-2">
                <button type="button" className={buttonClass('secondary')} onClick={() => setConfirmAccept(false)}>
                  Not yet
                </button>
                <button
                  type="button"
                  className={buttonClass('danger-outline')}
                  onClick={() => {
                    setConfirmAccept(false);
                    move('accepted');
                  }}
                >
                  Accept with {overCapacity.length === 1 ? 'it' : 'them'} over capacity
                </button>
              </div>
            </div>
          )}
          {change.isError && <p role="alert" className="text-danger">{change.error.message}</p>}
        </div>
      )}
      {isSubmitter && status === 'in_review' && <p className="mt-2 text-sm text-ink-soft">You made, edited or sent this survey, so another engineer must accept it.</p>}
      {events.length > 0 && (
        <details className="mt-2 text-sm">
          <summary className="cursor-pointer font-bold">Status history ({events.length})</summary>
          <ol className="mt-1 space-y-1">
            {events.map((e) => (
              <li key={e.id}>
                {when(e.at)}: {e.actorName} — {STATUS_LABELS[e.from]} → <strong>{STATUS_LABELS[e.to]}</strong> (revision {e.revision}){e.note ? `: “${e.note}”` : ''}
              </li>
            ))}
          </ol>
        </details>
      )}
    </section>
  );
}
