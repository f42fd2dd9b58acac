/**
 * The engineer's notes on a survey as the surveyor's device holds them after a sync: the last
 * status move and its note, the verdicts, the operating limits and the comment threads. Works
 * offline. The workspace drops it in whole, or with `target` to show only one item's comments.
 */
import { useState, type FormEvent } from 'react';
import type { CommentTarget, ReviewComment } from '@shared/api/review';
import type { Survey } from '@shared/schemas/survey';
import { STATUS_LABELS } from '@shared/review/status';
import { boundaryVerdictLabel, describeLimit, namesFromSurvey, surveyVerdictLabel, verdictSeverity } from '@shared/review/words';
import { useUnitSystem } from '@client/lib/unit-system';
import { useReviewNotes } from '@client/offline/review-notes';
import { discardReply, queueReply, useLocalReplies } from '@client/offline/replies';
import type { LocalReply } from '@client/offline/db';
import { useSession } from '@client/lib/session';
import { threadState } from '@shared/review/threads';
import { buttonClass } from '@client/components/ui/button';
import { inputCls } from '@client/components/ui/fields';
import { ThreadStateChip } from './thread-state-chip';
import { formatUtc } from '@shared/review/time-words';
import { conditionName } from '@shared/review/plain-words';

const when = formatUtc;
const SEVERITY = ['border-ok bg-ok-soft', 'border-caution bg-caution-soft', 'border-danger bg-danger-soft', 'border-danger bg-danger-soft'];

function itemName(survey: Survey | undefined, t: CommentTarget): string {
  if (!survey) return t.kind;
  switch (t.kind) {
    case 'survey':
      return 'The whole survey';
    case 'vessel':
      return `Vessel ${survey.vessel.name}`;
    case 'condition': {
      const c = survey.conditions.find((x) => x.id === t.id);
      return c ? `Readings “${conditionName(c, survey.vessel.shipTimeOffsetMin)}”` : 'Readings no longer in the survey';
    }
    case 'compartment':
      return survey.compartments.find((x) => x.id === t.id)?.name ?? 'A space no longer in the survey';
    case 'boundary':
      return survey.boundaries.find((x) => x.id === t.id)?.name ?? 'A boundary no longer in the survey';
    case 'photo':
      return `Photo ${survey.photos?.find((x) => x.id === t.id)?.caption ?? ''}`.trim();
  }
}

/** The surveyor's answer, kept on the device first and sent with the next sync (works with no signal). */
function ReplyForm({ root }: { root: ReviewComment }) {
  const [open, setOpen] = useState(false);
  const [body, setBody] = useState('');
  const [saving, setSaving] = useState(false);
  const session = useSession();
  const id = `reply-${root.id}`;
  if (!open)
    return (
      <button type="button" className={buttonClass('link', 'mt-1')} onClick={() => setOpen(true)}>
        Reply
      </button>
    );
  const send = async (e: FormEvent) => {
    e.preventDefault();
    if (!body.trim()) return;
    setSaving(true);
    try {
      await queueReply({ surveyId: root.surveyId, parentId: root.id, target: root.target, body, authorName: session.user?.name ?? 'You' });
      setBody('');
      setOpen(false);
    } finally {
      setSaving(false);
    }
  };
  return (
    <form className="mt-2 flex flex-col gap-1" onSubmit={(e) => void send(e)}>
      <label htmlFor={id} className="text-sm font-bold">
        Your reply
      </label>
      <textarea id={id} className={`${inputCls} py-2`} rows={2} maxLength={4000} value={body} onChange={(e) => setBody(e.target.value)} required />
      <div className="flex flex-wrap gap-2">
        <button type="submit" className={buttonClass('primary')} disabled={saving || !body.trim()}>
          Send reply
        </button>
        <button type="button" className={buttonClass('secondary')} onClick={() => setOpen(false)}>
          Cancel
        </button>
      </div>
    </form>
  );
}

function LocalReplyView({ reply }: { reply: LocalReply }) {
  return (
    <div className="ml-3 mt-1 border-l-4 border-sea-soft pl-2" data-testid="local-reply" data-state={reply.state}>
      <p className="whitespace-pre-wrap">{reply.body}</p>
      <p className="text-xs text-ink-soft">
        {reply.authorName} · {when(reply.createdAt)} ·{' '}
        {reply.state === 'rejected' ? (
          <span className="font-bold text-danger" role="alert">
            Not sent: {reply.reason}{' '}
            <button type="button" className={buttonClass('danger-link')} onClick={() => void discardReply(reply.id)}>
              Discard
            </button>
          </span>
        ) : reply.state === 'sent' ? (
          'sent'
        ) : (
          <strong>waiting to send</strong>
        )}
      </p>
    </div>
  );
}

function Thread({ root, replies, local, survey, showTarget }: { root: ReviewComment; replies: ReviewComment[]; local: LocalReply[]; survey?: Survey; showTarget: boolean }) {
  const waiting = local.filter((r) => r.state !== 'rejected');
  // A reply waiting on the device already answers the thread, as far as the surveyor is concerned.
  const state = threadState(root, [root, ...replies, ...waiting.map(() => ({ authorRole: 'surveyor' }))]);
  return (
    <li className="rounded border border-line bg-card p-2" data-testid="review-note-comment" data-thread-state={state}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        {showTarget ? <p className="text-xs font-bold uppercase tracking-wide text-ink-soft">{itemName(survey, root.target)}</p> : <span />}
        <ThreadStateChip state={state} />
      </div>
      <p className="whitespace-pre-wrap">{root.body}</p>
      <p className="text-xs text-ink-soft">
        {root.authorName} · {when(root.createdAt)}
      </p>
      {replies.map((r) => (
        <div key={r.id} className="ml-3 mt-1 border-l-4 border-sea-soft pl-2">
          <p className="whitespace-pre-wrap">{r.body}</p>
          <p className="text-xs text-ink-soft">
            {r.authorName} · {when(r.createdAt)}
          </p>
        </div>
      ))}
      {local.map((r) => (
        <LocalReplyView key={r.id} reply={r} />
      ))}
      {root.resolvedAt ? (
        <p className="mt-1 text-xs text-ink-soft">
          Resolved by {root.resolvedByName ?? 'the reviewer'} · {when(root.resolvedAt)}
        </p>
      ) : (
        <ReplyForm root={root} />
      )}
    </li>
  );
}

export function ReviewNotes({ surveyId, survey, target }: { surveyId: string; survey?: Survey; target?: CommentTarget }) {
  const notes = useReviewNotes(surveyId);
  const localReplies = useLocalReplies(surveyId);
  const system = useUnitSystem();
  if (!notes) return null;
  const comments = target ? notes.comments.filter((c) => c.target.kind === target.kind && c.target.id === target.id) : notes.comments;
  const roots = comments.filter((c) => !c.parentId);
  const repliesOf = (id: string) => comments.filter((c) => c.parentId === id);
  // A sent reply stays on the device until the pull brings it as a comment: show it once.
  const seen = new Set(notes.comments.map((c) => c.id));
  const localOf = (id: string) => (localReplies ?? []).filter((r) => r.parentId === id && !seen.has(r.id));

  if (target) {
    if (roots.length === 0) return null;
    return (
      <section aria-label="Reviewer’s comments" className="space-y-2" data-testid="review-notes">
        <h3 className="font-bold">Reviewer’s comments</h3>
        <ul className="space-y-2">
          {roots.map((c) => (
            <Thread key={c.id} root={c} replies={repliesOf(c.id)} local={localOf(c.id)} survey={survey} showTarget={false} />
          ))}
        </ul>
      </section>
    );
  }

  const surveyVerdict = notes.verdicts.find((v) => v.scope === 'survey');
  const boundaryVerdicts = notes.verdicts.filter((v) => v.scope === 'boundary');
  const names = survey ? namesFromSurvey(survey) : { compartment: () => 'a compartment', boundary: () => 'a boundary' };
  const boundaryName = (id: string | null) => (id && survey?.boundaries.find((b) => b.id === id)?.name) || 'A boundary';

  return (
    <section aria-labelledby="review-notes-h" className="space-y-3 rounded-lg border-2 border-sea bg-sea-soft/40 p-3" data-testid="review-notes">
      <h2 id="review-notes-h" className="text-xl">
        From the review
      </h2>
      <p>
        Status: <strong>{STATUS_LABELS[notes.status]}</strong>
        {notes.lastEvent && (
          <span className="text-ink-soft">
            {' '}
            ({notes.lastEvent.actorName}, {when(notes.lastEvent.at)})
          </span>
        )}
      </p>
      {notes.lastEvent?.note && (
        <p className="rounded border-l-4 border-hull bg-card p-2 italic" data-testid="review-status-note">
          “{notes.lastEvent.note}”
        </p>
      )}
      {surveyVerdict && (
        <p className={`rounded border-2 p-2 font-bold ${SEVERITY[verdictSeverity(surveyVerdict.verdict)]}`}>
          {surveyVerdictLabel(surveyVerdict.verdict)}
          {surveyVerdict.note && <span className="block font-normal">{surveyVerdict.note}</span>}
        </p>
      )}
      {boundaryVerdicts.length > 0 && (
        <ul className="space-y-1">
          {boundaryVerdicts.map((v) => (
            <li key={v.boundaryId} className={`rounded border-2 px-2 py-1 ${SEVERITY[verdictSeverity(v.verdict)]}`}>
              <strong>{boundaryName(v.boundaryId)}</strong>: {boundaryVerdictLabel(v.verdict)}
              {v.note ? ` — ${v.note}` : ''}
            </li>
          ))}
        </ul>
      )}
      {notes.limits.length > 0 && (
        <div>
          <h3 className="font-bold">Operating limits</h3>
          <ol className="list-decimal space-y-1 pl-5">
            {notes.limits.map((l) => (
              <li key={l.id} className="font-bold">
                {describeLimit(l, names, system)}
              </li>
            ))}
          </ol>
        </div>
      )}
      {roots.length > 0 && (
        <div>
          <h3 className="font-bold">Comments</h3>
          <ul className="mt-1 space-y-2">
            {roots.map((c) => (
              <Thread key={c.id} root={c} replies={repliesOf(c.id)} local={localOf(c.id)} survey={survey} showTarget />
            ))}
          </ul>
        </div>
      )}
    </section>
  );
}
