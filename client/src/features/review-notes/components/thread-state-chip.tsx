/** A comment thread's state in words and a shape, the same on the phone and at the desk (never colour alone). */
import { THREAD_STATE_LABELS, type ThreadState } from '@shared/review/threads';

const LOOK: Record<ThreadState, { cls: string; mark: string }> = {
  open: { cls: 'border-caution bg-caution-soft', mark: '●' },
  answered: { cls: 'border-sea bg-sea-soft', mark: '↩' },
  resolved: { cls: 'border-ok bg-ok-soft', mark: '✓' },
};

export function ThreadStateChip({ state }: { state: ThreadState }) {
  const look = LOOK[state];
  return (
    <span className={`inline-flex items-center gap-1 rounded-full border-2 px-2 text-xs font-bold text-ink ${look.cls}`} data-testid="thread-state" data-state={state}>
      <span aria-hidden="true">{look.mark}</span>
      {THREAD_STATE_LABELS[state]}
    </span>
  );
}
