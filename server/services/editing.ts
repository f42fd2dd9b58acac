/**
 * The server's half of "the engineer reviews, the surveyor measures" (shared/review/editing.ts): an
 * engineer's edit of a survey someone else made is refused whole, with 403 and a sentence, before
 * anything is written or stored. The workspace shows such a survey read-only, so only a device or
 * script that ignores it meets this.
 */
import { REVIEWER_READ_ONLY } from '@shared/review/editing';
import type { Db } from '../db/knex';
import type { AuthContext } from '../http/auth-context';
import { surveysReviewedBy } from '../db/repositories/editors';
import { forbidden, unauthorized } from '../errors';

/**
 * Throws 403 when the caller only reviews any of `surveyIds`. Asked of the database only when the
 * token says engineer (a surveyor's push costs nothing more); the role is then the database's.
 */
export async function refuseReviewersEdits(db: Db, auth: AuthContext, surveyIds: Iterable<string>): Promise<void> {
  if (auth.role !== 'engineer') return;
  const ids = [...new Set(surveyIds)];
  if (ids.length === 0) return;
  const { reviewed, memberRole } = await surveysReviewedBy(db, auth, ids);
  if (memberRole === null) throw unauthorized();
  if (reviewed.length > 0) throw forbidden(REVIEWER_READ_ONLY);
}
