import type { SurveyStatus } from '@shared/review/status';
import { STATUS_LABELS } from '@shared/review/status';

const CLS: Record<SurveyStatus, string> = {
  draft: 'border-line bg-card text-ink-soft',
  submitted: 'border-sea bg-sea-soft text-ink',
  in_review: 'border-caution bg-caution-soft text-ink',
  accepted: 'border-ok bg-ok-soft text-ink',
  returned: 'border-danger bg-danger-soft text-ink',
  // an accepted survey changed afterwards: as loud as a return, it needs a person's eyes again
  changed_since_review: 'border-danger bg-danger-soft text-ink border-dashed',
};

export function StatusChip({ status }: { status: SurveyStatus }) {
  return (
    <span className={`inline-block whitespace-nowrap rounded border-2 px-1.5 py-0.5 text-sm font-bold ${CLS[status]}`} data-status={status}>
      {STATUS_LABELS[status]}
    </span>
  );
}
