/**
 * The review as the surveyor sees it in the workspace: the survey's status, "Send for review" when
 * it is a draft, was returned or changed since review, and the engineer's notes (folded away until
 * opened). "Send for review" is queued in the outbox like any edit, after the edits made before it,
 * so it works offline and the engineer reviews what the surveyor sees; the server carries it out
 * when the push reaches it, and a refusal comes back with its reason like any refused edit.
 */
import { useState } from 'react';
import type { Survey } from '@shared/schemas/survey';
import { CHANGE_SENDS_BACK, STATUS_LABELS, transitionsFor } from '@shared/review/status';
import { useSession } from '@client/lib/session';
import { applyLocalChange, useLocalSurvey, usePendingCount } from '@client/offline/survey-store';
import { useQueuedSubmit } from '@client/offline/local-surveys';
import { syncNow, useSyncState } from '@client/offline/sync';
import { useReviewNotes } from '@client/offline/review-notes';
import { ReviewNotes } from './review-notes';
import { buttonClass } from '@client/components/ui/button';
import { figureNotes, figureNoteSentence } from '@shared/review/assumptions';

export function SurveyReviewBar({ surveyId, survey }: { surveyId: string; survey?: Survey }) {
  const local = useLocalSurvey(surveyId);
  const pending = usePendingCount(surveyId) ?? 0;
  const notes = useReviewNotes(surveyId);
  const queued = useQueuedSubmit(surveyId);
  const online = useSyncState().state !== 'offline';
  const { user } = useSession();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  // a survey resting on unconfirmed defaults goes to review only past a screen that lists them
  const [reviewing, setReviewing] = useState(false);
  if (!local) return null;
  const assumed = survey ? figureNotes(survey).filter((n) => n.mark === 'assumed') : [];
  const waiting = queued?.state === 'pending';
  // Edits to a reviewed survey still on this device: the server will make it "changed since review"
  // as they arrive, so it may be sent again already (offline too), queued after them.
  const changedHere = CHANGE_SENDS_BACK.includes(local.status) && pending - (waiting ? 1 : 0) > 0;
  const status = changedHere ? 'changed_since_review' : local.status;
  const submit = user && !waiting ? transitionsFor(status, user.role).find((t) => t.action === 'submit') : undefined;
  const count = notes ? notes.comments.length + notes.verdicts.length + notes.limits.length : 0;

  const send = async () => {
    setReviewing(false);
    setBusy(true);
    setError(null);
    try {
      // Kept on the device first, behind the edits already waiting: sent with them when a link exists.
      await applyLocalChange(surveyId, { kind: 'submit' });
      void syncNow();
    } catch (e) {
      setError(e instanceof Error ? e.message : 'The survey could not be sent.');
    } finally {
      setBusy(false);
    }
  };

  return (
    <section aria-label="Review" className="rounded-lg border border-line bg-card p-2" data-testid="survey-review-bar">
      <div className="flex flex-wrap items-center gap-2">
        <span className="text-sm">
          Review: <strong data-testid="survey-review-status" data-status={status}>{STATUS_LABELS[status]}</strong>
          {changedHere && <span className="text-ink-soft"> (on this device; not synced yet)</span>}
        </span>
        {submit && (
          <button
            type="button"
            className={buttonClass('primary', 'ml-auto')}
            onClick={() => (assumed.length > 0 ? setReviewing(true) : void send())}
            disabled={busy || reviewing}
          >
            {busy ? 'Sending…' : submit.label}
          </button>
        )}
      </div>
      {submit && reviewing && (
        <div className="mt-2 space-y-2 rounded-md border-2 border-caution bg-caution-soft p-3" role="region" aria-label="Assumed figures" data-testid="assumptions-screen">
          <h3 className="text-lg font-bold">
            {assumed.length === 1 ? 'One figure is' : `${assumed.length} figures are`} assumed, not measured or confirmed
          </h3>
          <p className="text-sm">The engineer will see this list beside the loads. Confirm or replace them in their sections, or send the survey with them as they are.</p>
          <ul className="list-disc space-y-0.5 pl-5 text-sm">
            {assumed.map((n) => (
              <li key={`${n.entityId}-${n.field}`}>{figureNoteSentence(n)}</li>
            ))}
          </ul>
          <div className="flex flex-wrap gap-2">
            <button type="button" className={buttonClass('secondary')} onClick={() => setReviewing(false)}>
              Go back and confirm them
            </button>
            <button type="button" className={buttonClass('primary')} onClick={() => void send()}>
              Send for review with these assumptions
            </button>
          </div>
        </div>
      )}
      {submit && pending > 0 && <p className="mt-1 text-sm text-ink-soft">{pending === 1 ? '1 edit syncs first.' : `${pending} edits sync first.`}</p>}
      {waiting && (
        <p className="mt-1 rounded-md border-2 border-caution bg-caution-soft p-2 text-sm font-bold" role="status" data-testid="submit-queued">
          {online ? 'Sending for review…' : 'Sending for review when the link returns. It is kept on this device.'}
          {pending === 2 ? ' 1 edit goes first.' : pending > 2 ? ` ${pending - 1} edits go first.` : ''}
        </p>
      )}
      {queued?.state === 'rejected' && (
        <p className="mt-1 rounded-md border-2 border-danger bg-danger-soft p-2 text-sm" role="alert" data-testid="submit-refused">
          <strong>Not sent for review:</strong> {queued.reason}
        </p>
      )}
      {error && (
        <p role="alert" className="mt-1 text-sm font-bold text-danger">
          {error}
        </p>
      )}
      {notes && (count > 0 || notes.lastEvent?.note) && (
        <details className="mt-2" open={local.status === 'returned'}>
          <summary className="min-h-touch cursor-pointer content-center font-bold text-sea">Reviewer’s notes ({count})</summary>
          <div className="mt-2">
            <ReviewNotes surveyId={surveyId} survey={survey} />
          </div>
        </details>
      )}
    </section>
  );
}
