/**
 * Other kinds of records a device receives with each pull (reviewers' comments, verdicts…), keyed
 * by the name they appear under in `PullResponse.extras`. A source returns the organisation's
 * records written by transactions at or after `sinceXid`: give the table a `change_xid xid8` column
 * with the trigger `brineline_touch_change_xid()` (migrations/20261201000200_surveys.ts) and filter
 * `WHERE organisation_id = ? AND change_xid >= ?::xid8`. Runs inside the pull's read-only
 * repeatable-read transaction, so it sees the same snapshot as the surveys.
 */
import type { Knex } from 'knex';
import type { Role } from '@shared/api/roles';
import { reviewNotesSince } from './review';

export interface PullExtraContext {
  orgId: string;
  userId: string;
  role: Role;
  /** Lower bound (inclusive) of the writing transaction id, as text. */
  sinceXid: string;
}

export type PullExtraSource = (trx: Knex.Transaction, ctx: PullExtraContext) => Promise<unknown[]>;

/** Add a source here: `comments: commentsSince`. */
export const pullExtraSources: Record<string, PullExtraSource> = {
  review: (trx, ctx) => reviewNotesSince(trx, ctx),
};
