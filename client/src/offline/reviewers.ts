/**
 * Who is reviewing each survey, from the reviewers' notes the sync pull keeps on the device
 * (offline/review-notes.ts). Type-only imports, so the survey list does not load zod for it.
 */
import { useMemo } from 'react';
import { useLiveQuery } from 'dexie-react-hooks';
import type { ReviewNotes } from '@shared/api/review';
import { db } from './db';

const REVIEW_MOVES = new Set(['in_review', 'accepted', 'returned']);

/** The reviewer named by a survey's notes: who last moved it in review, else who last gave a verdict. */
export function reviewerOf(notes: ReviewNotes | undefined): string | null {
  if (!notes) return null;
  if (notes.lastEvent && REVIEW_MOVES.has(notes.lastEvent.to)) return notes.lastEvent.actorName;
  const latest = [...notes.verdicts].sort((a, b) => b.setAt.localeCompare(a.setAt))[0];
  return latest?.setByName ?? null;
}

/** Reviewer name by survey id, for every survey with notes on this device (reactive). */
export function useReviewers(): Map<string, string> {
  const rows = useLiveQuery(() => db.reviewNotes.toArray(), []);
  return useMemo(
    () =>
      new Map(
        (rows ?? []).flatMap((notes) => {
          const name = reviewerOf(notes);
          return name ? [[notes.surveyId, name] as const] : [];
        }),
      ),
    [rows],
  );
}
