/** The engineer's queue: surveys sent for review or under review, oldest first. */
import { Link } from 'react-router';
import { UtilisationBadge } from '@client/features/results/components/utilisation';
import { paths } from '@client/config/paths';
import { useQueue } from '../api/get-queue';
import { StatusChip } from './status-chip';
import { formatUtc } from '@shared/review/time-words';

const when = formatUtc;

export function ReviewQueue() {
  const queue = useQueue();
  return (
    <main className="mx-auto max-w-6xl p-3 sm:p-5">
      <h1 className="text-2xl">Review queue</h1>
      <p className="mt-1 text-ink-soft">Surveys of your firm waiting for an engineer’s check, the longest waiting first.</p>
      {queue.isPending && <p className="mt-4">Loading…</p>}
      {queue.isError && (
        <p role="alert" className="mt-4 rounded-lg border-2 border-danger bg-danger-soft p-3">
          {queue.error.message}
        </p>
      )}
      {queue.data && queue.data.items.length === 0 && <p className="mt-4 rounded-lg border border-line bg-card p-4">Nothing is waiting for review.</p>}
      {queue.data && queue.data.items.length > 0 && (
        <ul className="mt-4 space-y-2" data-testid="review-queue">
          {queue.data.items.map((item) => (
            <li key={item.surveyId}>
              <Link
                to={paths.reviewSurvey(item.surveyId)}
                className="grid gap-x-4 gap-y-1 rounded-lg border border-line bg-card p-3 no-underline shadow-sm hover:border-hull sm:grid-cols-[2fr_1.3fr_1.3fr_auto] sm:items-center"
                data-testid="queue-item"
              >
                <span className="min-w-0">
                  <span className="block text-lg font-bold">{item.vesselName}</span>
                  <span className="block truncate text-sm text-ink-soft">{item.title}</span>
                </span>
                <span className="text-sm">
                  <span className="block">
                    <span className="text-ink-soft">Surveyor </span>
                    {item.surveyorName ?? '—'}
                  </span>
                  <span className="block">
                    <span className="text-ink-soft">Sent </span>
                    {when(item.submittedAt)}
                  </span>
                </span>
                <span className="text-sm">
                  <span className="block text-ink-soft">Soundings</span>
                  {when(item.soundingsAt)}
                </span>
                <span className="flex flex-wrap items-center gap-2 sm:flex-col sm:items-end">
                  <StatusChip status={item.status} />
                  {item.engineVersion ? (
                    <span className="flex flex-wrap items-center gap-1 text-sm sm:justify-end">
                      <span className="text-ink-soft">Worst{item.worstBoundaryName ? ` (${item.worstBoundaryName})` : ''}</span>
                      <UtilisationBadge value={item.worstUtilisation} compact />
                    </span>
                  ) : (
                    <span className="text-sm text-ink-soft">not yet computed</span>
                  )}
                </span>
              </Link>
            </li>
          ))}
        </ul>
      )}
    </main>
  );
}
