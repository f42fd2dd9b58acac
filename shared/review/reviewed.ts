/**
 * Which revision a review rests on, read from a survey's status trail. Two questions:
 * - the acceptance that still stands (`standingAcceptance`): the latest move to "accepted" with no
 *   "returned for changes" after it. Its revision is what the master's brief shows while newer,
 *   unreviewed revisions exist;
 * - the revision the desk compares with (`sinceReviewBase`), once the survey changed after being
 *   sent, under review or accepted: the standing acceptance if there is one, else the revision
 *   that was sent or under review when the first change came.
 */
import type { StatusEvent } from '../api/review';

type Move = Pick<StatusEvent, 'from' | 'to' | 'revision' | 'at' | 'actorName'>;

/** Oldest first; moves of one transaction share a time, so the revision breaks the tie. */
const ordered = (events: readonly Move[]) => [...events].sort((a, b) => a.at.localeCompare(b.at) || a.revision - b.revision);

export function standingAcceptance<E extends Move>(events: readonly E[]): E | null {
  let accepted: E | null = null;
  for (const e of ordered(events) as E[]) {
    if (e.to === 'accepted') accepted = e;
    else if (e.to === 'returned') accepted = null;
  }
  return accepted;
}

export interface SinceReview {
  /** The revision compared with. */
  revision: number;
  /** Whether that revision was accepted, or only sent / under review. */
  reviewed: 'accepted' | 'submitted' | 'in_review';
  /** Who accepted it, when accepted. */
  acceptedBy: string | null;
  acceptedAt: string | null;
}

/**
 * The revision the desk shows the changes since, or null when the survey has not changed since its
 * last review move (or the review after the change is finished: accepted or returned).
 */
export function sinceReviewBase(events: readonly Move[], currentRevision: number): SinceReview | null {
  const list = ordered(events);
  let lastChange = -1;
  list.forEach((e, i) => {
    if (e.to === 'changed_since_review') lastChange = i;
  });
  if (lastChange < 0) return null;
  if (list.slice(lastChange + 1).some((e) => e.to === 'accepted' || e.to === 'returned')) return null;
  const accepted = standingAcceptance(list.slice(0, lastChange));
  const base = accepted
    ? { revision: accepted.revision, reviewed: 'accepted' as const, acceptedBy: accepted.actorName, acceptedAt: accepted.at }
    : {
        revision: list[lastChange]!.revision - 1,
        reviewed: list[lastChange]!.from === 'in_review' ? ('in_review' as const) : ('submitted' as const),
        acceptedBy: null,
        acceptedAt: null,
      };
  return base.revision < currentRevision ? base : null;
}
