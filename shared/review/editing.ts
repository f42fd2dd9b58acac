/**
 * Who may change a survey's figures. The shore engineer reviews the surveyor's survey and never
 * edits it: comments, verdicts and limits go on the review desk, and the figures stay what the
 * surveyor measured. An engineer edits only a survey they made (DESIGN.md: an engineer can do
 * everything a surveyor can, on their own surveys). Surveyors and admins edit any survey of their
 * firm. The workspace shows a reviewer's view read-only by this rule; the server refuses the edit by it.
 */
import type { Role } from '../api/roles';

/** True when a person in `role` reviews, and may not edit, the survey made by `ownerId`. */
export function reviewsOnly(role: Role, userId: string, ownerId: string | null | undefined): boolean {
  return role === 'engineer' && !!ownerId && ownerId !== userId;
}

/** The readable answer to an edit refused by `reviewsOnly`. */
export const REVIEWER_READ_ONLY =
  'You review this survey: its figures are the surveyor’s and only they change them. Comment, give a verdict or set a limit on the review desk instead.';
