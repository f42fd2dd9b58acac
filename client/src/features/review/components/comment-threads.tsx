/** Comments threaded on any item of the survey; replies attach to a thread's first comment. */
import { useState, type FormEvent } from 'react';
import type { ReviewComment } from '@shared/api/review';
import type { Survey } from '@shared/schemas/survey';
import { useAddComment, useResolveComment } from '../api/add-comment';
import { threadState } from '@shared/review/threads';
import { ThreadStateChip } from '@client/features/review-notes/components/thread-state-chip';
import { targetKey, targetLabel, targetOptions } from './review-targets';
import { buttonClass } from '@client/components/ui/button';
import { inputCls } from '@client/components/ui/fields';
import { formatUtc } from '@shared/review/time-words';

const when = formatUtc;

function Reply({ surveyId, parent }: { surveyId: string; parent: ReviewComment }) {
  const [body, setBody] = useState('');
  const [open, setOpen] = useState(false);
  const add = useAddComment(surveyId);
  if (!open)
    return (
      <button type="button" className={buttonClass('link', 'mt-1')} onClick={() => setOpen(true)}>
        Reply
      </button>
    );
  const submit = (e: FormEvent) => {
    e.preventDefault();
    add.mutate({ target: parent.target, body, parentId: parent.id }, { onSuccess: () => (setBody(''), setOpen(false)) });
  };
  return (
    <form onSubmit={submit} className="mt-2 flex flex-col gap-2">
      <label className="text-sm font-bold" htmlFor={`reply-${parent.id}`}>
        Reply
      </label>
      <textarea id={`reply-${parent.id}`} className={`${inputCls} py-2`} rows={2} value={body} onChange={(e) => setBody(e.target.value)} required />
      <div className="flex gap-2">
        <button type="submit" className={buttonClass('primary')} disabled={add.isPending}>
          Send reply
        </button>
        <button type="button" className={buttonClass('secondary')} onClick={() => setOpen(false)}>
          Cancel
        </button>
      </div>
      {add.isError && <p role="alert" className="text-danger">{add.error.message}</p>}
    </form>
  );
}

function ResolveButton({ surveyId, thread }: { surveyId: string; thread: ReviewComment }) {
  const resolve = useResolveComment(surveyId);
  return (
    <>
      <button
        type="button"
        className={buttonClass('link', 'mt-1')}
        disabled={resolve.isPending}
        onClick={() => resolve.mutate({ commentId: thread.id, resolved: !thread.resolvedAt })}
      >
        {thread.resolvedAt ? 'Reopen thread' : 'Mark resolved'}
      </button>
      {resolve.isError && (
        <p role="alert" className="text-danger">
          {resolve.error.message}
        </p>
      )}
    </>
  );
}

export function CommentThreads({
  surveyId,
  doc,
  comments,
  initialTarget,
  canResolve = false,
}: {
  surveyId: string;
  doc: Survey;
  comments: ReviewComment[];
  initialTarget?: string;
  /** The engineer closes threads; others only answer them. */
  canResolve?: boolean;
}) {
  const options = targetOptions(doc);
  const [target, setTarget] = useState(initialTarget ?? options[0]!.key);
  const [body, setBody] = useState('');
  const add = useAddComment(surveyId);
  const roots = comments.filter((c) => !c.parentId);
  const replies = (id: string) => comments.filter((c) => c.parentId === id);

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const chosen = options.find((o) => o.key === target);
    if (!chosen) return;
    add.mutate({ target: chosen.target, body }, { onSuccess: () => setBody('') });
  };

  return (
    <section aria-labelledby="comments-h" className="rounded-lg border border-line bg-card p-3">
      <h2 id="comments-h" className="text-lg">
        Comments
      </h2>
      <form onSubmit={submit} className="mt-2 flex flex-col gap-2" data-testid="comment-form">
        <label className="text-sm font-bold" htmlFor="comment-target">
          On
        </label>
        <select id="comment-target" className={inputCls} value={target} onChange={(e) => setTarget(e.target.value)}>
          {options.map((o) => (
            <option key={o.key} value={o.key}>
              {o.label}
            </option>
          ))}
        </select>
        <label className="text-sm font-bold" htmlFor="comment-body">
          Comment
        </label>
        <textarea id="comment-body" className={`${inputCls} py-2`} rows={3} value={body} onChange={(e) => setBody(e.target.value)} required />
        <button type="submit" className={buttonClass('primary', 'self-start')} disabled={add.isPending}>
          Add comment
        </button>
        {add.isError && <p role="alert" className="text-danger">{add.error.message}</p>}
      </form>
      {roots.length === 0 ? (
        <p className="mt-3 text-sm text-ink-soft">No comments yet.</p>
      ) : (
        <ul className="mt-3 space-y-3" data-testid="comment-list">
          {roots.map((c) => (
            <li key={c.id} className="rounded border border-line p-2" data-target={targetKey(c.target)} data-thread-state={threadState(c, [c, ...replies(c.id)])}>
              <div className="flex flex-wrap items-center justify-between gap-2">
                <p className="text-xs font-bold uppercase tracking-wide text-ink-soft">{targetLabel(doc, c.target)}</p>
                <ThreadStateChip state={threadState(c, [c, ...replies(c.id)])} />
              </div>
              <p className="mt-1 whitespace-pre-wrap">{c.body}</p>
              <p className="text-xs text-ink-soft">
                {c.authorName} ({c.authorRole}) · {when(c.createdAt)} · revision {c.revision}
              </p>
              {replies(c.id).map((r) => (
                <div key={r.id} className="ml-3 mt-2 border-l-4 border-sea-soft pl-2">
                  <p className="whitespace-pre-wrap">{r.body}</p>
                  <p className="text-xs text-ink-soft">
                    {r.authorName} ({r.authorRole}) · {when(r.createdAt)}
                  </p>
                </div>
              ))}
              {c.resolvedAt ? (
                <p className="mt-1 text-xs text-ink-soft">
                  Resolved by {c.resolvedByName ?? 'the reviewer'} · {when(c.resolvedAt)}
                </p>
              ) : (
                <Reply surveyId={surveyId} parent={c} />
              )}
              {canResolve && <ResolveButton surveyId={surveyId} thread={c} />}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
