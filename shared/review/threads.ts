/**
 * The state of a reviewer's comment thread, as the phone and the desk both show it:
 * - open: the last word is the reviewer's, so it waits for the surveyor;
 * - answered: the surveyor (or anyone not reviewing) had the last word, so it waits for the reviewer;
 * - resolved: the reviewer closed it.
 */
export type ThreadState = 'open' | 'answered' | 'resolved';

export const THREAD_STATE_LABELS: Record<ThreadState, string> = {
  open: 'Open',
  answered: 'Answered',
  resolved: 'Resolved',
};

/** Roles whose messages ask rather than answer. */
const REVIEWER_ROLES = new Set(['engineer']);

/** `messages` in the order written, the thread's first comment first. */
export function threadState(root: { resolvedAt?: string | null }, messages: readonly { authorRole: string }[]): ThreadState {
  if (root.resolvedAt) return 'resolved';
  const last = messages.at(-1);
  return !last || REVIEWER_ROLES.has(last.authorRole) ? 'open' : 'answered';
}
