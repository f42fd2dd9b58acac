/**
 * The review status of a survey and who may move it where. Pure data and one function, used by the
 * server to enforce the rules and by the client to offer only the buttons that will work.
 *
 * Decisions (documented in DEVELOPERS.md):
 * - Anyone who may edit surveys (surveyor, engineer, admin) may send their organisation's draft or
 *   returned survey for review: the person who measured is not always the one with the link.
 * - Only an engineer starts a review, accepts, returns or reopens. The admin coordinates people, not
 *   structure: a verdict on a bulkhead belongs to a naval architect.
 * - Nobody reviews their own work: whoever made, edited or sent the survey at any revision may not
 *   accept it (checked by the server, hasWorkedOn).
 * - An accepted survey can be reopened (back to "under review") when new soundings arrive.
 * - Accepted means accepted: any edit applied to a survey that is sent, under review or accepted
 *   moves it to "changed since review" (the database does it, in the same statement as the edit, so
 *   no writer can skip it). It then needs review again: sent again by an editor, or taken up again
 *   (or returned) by an engineer. The brief keeps showing the figures that were accepted.
 */
import type { Role } from '../api/roles';
import { SurveyStatusSchema, type SurveyStatus } from '../schemas/sync';

export { SurveyStatusSchema, type SurveyStatus };
export const SURVEY_STATUSES: readonly SurveyStatus[] = SurveyStatusSchema.options;

/** The words the interface and the brief use for each status. */
export const STATUS_LABELS: Record<SurveyStatus, string> = {
  draft: 'Draft',
  submitted: 'Sent for review',
  in_review: 'Under review',
  accepted: 'Accepted',
  returned: 'Returned for changes',
  changed_since_review: 'Changed since review',
};

/** Statuses in which an applied edit moves the survey to "changed since review" (mirrored by the migration's trigger). */
export const CHANGE_SENDS_BACK: readonly SurveyStatus[] = ['submitted', 'in_review', 'accepted'];

/** What the surveyor is told before editing a survey in one of CHANGE_SENDS_BACK. */
export function changeSendsBackWarning(status: SurveyStatus): string | null {
  if (!CHANGE_SENDS_BACK.includes(status)) return null;
  const was = status === 'accepted' ? 'was accepted' : status === 'in_review' ? 'is under review' : 'has been sent for review';
  return `This survey ${was}; a change sends it back for review.`;
}

export type StatusAction = 'submit' | 'start_review' | 'accept' | 'return' | 'reopen';

export interface Transition {
  action: StatusAction;
  from: SurveyStatus;
  to: SurveyStatus;
  roles: readonly Role[];
  /** Button wording. */
  label: string;
  /** A note is required (returning without saying why helps nobody). */
  noteRequired: boolean;
  /** The caller must not be the person who sent the current submission. */
  notBySubmitter: boolean;
}

const EDITORS: readonly Role[] = ['surveyor', 'engineer', 'admin'];
const REVIEWERS: readonly Role[] = ['engineer'];

export const TRANSITIONS: readonly Transition[] = [
  { action: 'submit', from: 'draft', to: 'submitted', roles: EDITORS, label: 'Send for review', noteRequired: false, notBySubmitter: false },
  { action: 'submit', from: 'returned', to: 'submitted', roles: EDITORS, label: 'Send for review again', noteRequired: false, notBySubmitter: false },
  { action: 'submit', from: 'changed_since_review', to: 'submitted', roles: EDITORS, label: 'Send for review again', noteRequired: false, notBySubmitter: false },
  { action: 'start_review', from: 'submitted', to: 'in_review', roles: REVIEWERS, label: 'Start review', noteRequired: false, notBySubmitter: false },
  { action: 'start_review', from: 'changed_since_review', to: 'in_review', roles: REVIEWERS, label: 'Review the changes', noteRequired: false, notBySubmitter: false },
  { action: 'accept', from: 'in_review', to: 'accepted', roles: REVIEWERS, label: 'Accept', noteRequired: false, notBySubmitter: true },
  { action: 'return', from: 'submitted', to: 'returned', roles: REVIEWERS, label: 'Return for changes', noteRequired: true, notBySubmitter: false },
  { action: 'return', from: 'in_review', to: 'returned', roles: REVIEWERS, label: 'Return for changes', noteRequired: true, notBySubmitter: false },
  { action: 'return', from: 'changed_since_review', to: 'returned', roles: REVIEWERS, label: 'Return for changes', noteRequired: true, notBySubmitter: false },
  { action: 'reopen', from: 'accepted', to: 'in_review', roles: REVIEWERS, label: 'Reopen review', noteRequired: true, notBySubmitter: false },
];

export type TransitionCheck =
  | { ok: true; transition: Transition }
  | { ok: false; reason: 'no_such_transition' | 'role' | 'own_submission' | 'note_required'; message: string };

/**
 * Whether `role` may move a survey from `from` to `to`. `isSubmitter` says whether the caller sent
 * the current submission; `note` is the caller's reason, if any.
 */
export function checkTransition(args: {
  from: SurveyStatus;
  to: SurveyStatus;
  role: Role;
  isSubmitter: boolean;
  note?: string | null;
}): TransitionCheck {
  const t = TRANSITIONS.find((x) => x.from === args.from && x.to === args.to);
  if (!t) {
    return {
      ok: false,
      reason: 'no_such_transition',
      message: `A survey that is “${STATUS_LABELS[args.from]}” cannot become “${STATUS_LABELS[args.to]}”.`,
    };
  }
  if (!t.roles.includes(args.role)) {
    return { ok: false, reason: 'role', message: `Only ${t.roles.join(' or ')} may ${t.label.toLowerCase()}.` };
  }
  if (t.notBySubmitter && args.isSubmitter) {
    return { ok: false, reason: 'own_submission', message: 'Someone who has not made, edited or sent this survey must accept it.' };
  }
  if (t.noteRequired && !args.note?.trim()) {
    return { ok: false, reason: 'note_required', message: 'Say why in the note.' };
  }
  return { ok: true, transition: t };
}

/** The moves `role` can make from `from` (for the buttons). */
export function transitionsFor(from: SurveyStatus, role: Role): Transition[] {
  return TRANSITIONS.filter((t) => t.from === from && t.roles.includes(role));
}

/** Statuses that appear in the review queue. */
export const QUEUE_STATUSES: readonly SurveyStatus[] = ['submitted', 'in_review', 'changed_since_review'];
/** Statuses for which a master's brief may be issued. */
export const BRIEFABLE_STATUSES: readonly SurveyStatus[] = ['in_review', 'accepted'];
/** Verdicts and limits are set while a review is open; an accepted survey is reopened to change them. */
export const REVIEWABLE_STATUSES: readonly SurveyStatus[] = ['in_review'];
