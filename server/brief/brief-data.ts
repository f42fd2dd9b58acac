/**
 * What the master's brief shows, as the brief service gathers it: its own file so both the page
 * (render-brief.ts) and the acknowledgement's "what was seen" token (brief-seen.ts) read it without
 * importing each other.
 */
import type { Survey } from '@shared/schemas/survey';
import type { SurveyResults } from '@shared/engine';
import type { OperatingLimit, Verdict } from '@shared/api/review';
import type { SurveyStatus } from '@shared/review/status';
import type { UnitSystem } from '@shared/units/units';

export interface BriefPageData {
  /** The document whose figures are shown: the accepted revision's while newer, unreviewed ones exist. */
  doc: Survey;
  results: SurveyResults | null;
  status: SurveyStatus;
  /** The survey's current revision. */
  revision: number;
  /** The revision of `doc` and `results` (defaults to `revision`). */
  shownRevision?: number;
  /** Set when the survey changed after the revision shown was accepted: the current, unreviewed revision. */
  newerRevision?: number | null;
  /** The accepted revision's document is not kept (changed before the rule existed): no figures shown. */
  figuresWithheld?: boolean;
  /** Revision the link was issued on; a later one means the survey changed since. */
  issuedRevision: number;
  units: UnitSystem;
  verdicts: Verdict[];
  limits: OperatingLimit[];
  organisationName: string;
  reviewedBy: string | null;
  reviewedAt: string | null;
  expiresAt: string;
  /** The engineer who sent the link, so the bridge knows whom to call. */
  engineer?: { name: string; email: string } | null;
  /** The master's latest "received and understood" on this link. */
  acknowledgement?: { name: string; at: string; revision: number } | null;
  /** The link's own token, for the acknowledgement form's address. */
  token?: string;
}
