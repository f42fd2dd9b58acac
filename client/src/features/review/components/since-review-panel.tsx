/** "Changed since review": every change made after the revision the review rests on, in plain words. */
import type { ReviewBundle } from '@shared/api/review';
import { changeLineText } from '@shared/review/survey-changes';
import { formatUtc } from '@shared/review/time-words';
import type { UnitSystem } from '@shared/units/units';

type Since = NonNullable<ReviewBundle['sinceReview']>;

const REVIEWED_WORDS: Record<Since['reviewed'], string> = {
  accepted: 'accepted',
  in_review: 'under review',
  submitted: 'sent for review',
};

export function SinceReviewPanel({ since, revision, system }: { since: Since; revision: number; system: UnitSystem }) {
  const head =
    since.reviewed === 'accepted'
      ? `Changed since ${since.acceptedBy ?? 'an engineer'} accepted revision ${since.revision}${since.acceptedAt ? ` (${formatUtc(since.acceptedAt)})` : ''}`
      : `Changed since revision ${since.revision} was ${REVIEWED_WORDS[since.reviewed]}`;
  return (
    <section aria-labelledby="since-review-h" className="mt-3 rounded-lg border-2 border-danger bg-danger-soft p-3" data-testid="since-review">
      <h2 id="since-review-h" className="text-lg">
        {head}
      </h2>
      <p className="text-sm">
        Now at revision {revision}. The master’s brief shows {since.reviewed === 'accepted' ? `revision ${since.revision} as accepted` : 'no verdict'} until these changes are reviewed.
      </p>
      {!since.documentKept ? (
        <p className="mt-1 text-sm">The document of revision {since.revision} is not kept (changed before this check existed): see each revision’s changes in the History tab.</p>
      ) : since.lines.length === 0 ? (
        <p className="mt-1 text-sm">The document is the same as in revision {since.revision}: the changes made since were undone.</p>
      ) : (
        <ul className="mt-2 list-disc space-y-0.5 pl-5 text-sm" data-testid="since-review-lines">
          {since.lines.map((l, i) => (
            <li key={i} className="break-words">
              {changeLineText(l, system)}
            </li>
          ))}
          {since.total > since.lines.length && <li>…and {since.total - since.lines.length} more (History tab).</li>}
        </ul>
      )}
    </section>
  );
}
