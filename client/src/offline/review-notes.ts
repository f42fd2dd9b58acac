/**
 * Reviewers' notes on the device: what the sync pull brings in `extras.review` (comments, verdicts,
 * limits, the last status move), one record per survey in the `reviewNotes` table, so they can be
 * read offline on deck. Each pull replaces a survey's record whole.
 */
import { useLiveQuery } from 'dexie-react-hooks';
import { ReviewNotesSchema, type ReviewNotes } from '@shared/api/review';
import { db } from './db';
import { forgetDeliveredReplies } from './replies';

/** Stores the notes of a pull; records that do not parse are skipped (a newer server, an older app). */
export async function storeReviewNotes(records: readonly unknown[] | undefined): Promise<void> {
  if (!records?.length) return;
  const rows = records.flatMap((r) => {
    const parsed = ReviewNotesSchema.safeParse(r);
    return parsed.success ? [parsed.data] : [];
  });
  if (rows.length) await db.reviewNotes.bulkPut(rows);
  await forgetDeliveredReplies(new Set(rows.flatMap((n) => n.comments.map((c) => c.id))));
}

export function useReviewNotes(surveyId: string): ReviewNotes | null | undefined {
  return useLiveQuery(async () => (await db.reviewNotes.get(surveyId)) ?? null, [surveyId]);
}
