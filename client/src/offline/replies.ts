/**
 * Replies to a reviewer's comment written on the device. Like every edit they are kept first on the
 * device (the `replies` table, an outbox of their own) and sent by the sync engine when a link exists;
 * each carries an id made here, so a reply sent twice after a lost answer is still one comment. Until the
 * server has it the thread shows the reply as waiting; the next pull brings it back as a comment.
 */
import { useLiveQuery } from 'dexie-react-hooks';
import type { CommentTarget, NewComment } from '@shared/api/review';
import { ApiError, api, jsonBody } from '@client/lib/api-client';
import { db, type LocalReply } from './db';
import { announceLocalChange } from './survey-store';

export async function queueReply(reply: { surveyId: string; parentId: string; target: CommentTarget; body: string; authorName: string }): Promise<LocalReply> {
  const row: LocalReply = { ...reply, body: reply.body.trim(), id: crypto.randomUUID(), createdAt: new Date().toISOString(), state: 'pending' };
  await db.replies.put(row);
  announceLocalChange();
  return row;
}

/** The replies of one survey not yet on the server (reactive), oldest first. */
export function useLocalReplies(surveyId: string): LocalReply[] | undefined {
  return useLiveQuery(() => db.replies.where('surveyId').equals(surveyId).sortBy('createdAt'), [surveyId]);
}

export async function discardReply(id: string): Promise<void> {
  await db.replies.delete(id);
}

/**
 * Sends every waiting reply, oldest first. A reply the server refuses for good (its thread or survey
 * is gone, the text is too long) is marked with the reason and kept for the user to copy; a lost
 * link or an expired session stops the round and is thrown to the sync engine, which retries.
 */
export async function sendPendingReplies(): Promise<void> {
  const waiting = await db.replies.where('state').equals('pending').sortBy('createdAt');
  for (const r of waiting) {
    const body: NewComment & { id: string } = { id: r.id, target: r.target, body: r.body, parentId: r.parentId };
    try {
      await api(`/api/review/surveys/${encodeURIComponent(r.surveyId)}/comments`, { method: 'POST', ...jsonBody(body) });
    } catch (err) {
      if (err instanceof ApiError && err.status >= 400 && err.status < 500 && err.status !== 401 && err.status !== 408 && err.status !== 429) {
        await db.replies.update(r.id, { state: 'rejected', reason: err.message });
        continue;
      }
      throw err;
    }
    // Kept until the pull that follows brings the comment, so the thread never loses it in between.
    await db.replies.update(r.id, { state: 'sent' as LocalReply['state'] });
  }
}

/** Drops the sent replies the pull has brought back as comments. */
export async function forgetDeliveredReplies(commentIds: ReadonlySet<string>): Promise<void> {
  const sent = await db.replies.where('state').equals('sent').toArray();
  const delivered = sent.filter((r) => commentIds.has(r.id)).map((r) => r.id);
  if (delivered.length) await db.replies.bulkDelete(delivered);
}
