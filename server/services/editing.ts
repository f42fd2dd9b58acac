/**
 * The server's half of "the engineer reviews, the surveyor measures" (shared/review/editing.ts): an
 * engineer's edit of a survey someone else made is refused whole, with 403 and a sentence, before
 * anything is written or stored. The workspace shows such a survey read-only, so only a device or
 * script that ignores it meets this.
 *
 * The role it judges by is the stored membership's, never the access token's: a surveyor made an
 * engineer an hour ago still holds a token that says surveyor, and is a reviewer from the next request.
 */
import { LRUCache } from 'lru-cache';
import { REVIEWER_READ_ONLY, reviewsOnly } from '@shared/review/editing';
import type { Db } from '../db/knex';
import type { AuthContext } from '../http/auth-context';
import { surveyMakers } from '../db/repositories/editors';
import { forbidden, unauthorized } from '../errors';

/**
 * Who made each survey, as far as this process has seen. A survey's maker never changes (surveys are
 * never deleted and ids are never reused), so a remembered maker is never stale on any instance.
 */
export class SurveyMakers {
  private readonly makers = new LRUCache<string, string>({ max: 100_000 });

  get(surveyId: string): string | undefined {
    return this.makers.get(surveyId);
  }

  remember(makers: Map<string, string>): void {
    for (const [id, maker] of makers) this.makers.set(id, maker);
  }
}

/**
 * Throws 403 when the caller only reviews any of `surveyIds`, 401 when the caller is no active
 * member. Everyone edits a survey they made whatever their role, so surveys `known` to be the
 * caller's cost nothing; otherwise one round trip reads the makers and the caller's role.
 */
export async function refuseReviewersEdits(db: Db, auth: AuthContext, surveyIds: Iterable<string>, known?: SurveyMakers): Promise<void> {
  const ids = [...new Set(surveyIds)].filter((id) => known?.get(id) !== auth.userId);
  if (ids.length === 0) return;
  const { makers, memberRole } = await surveyMakers(db, auth, ids);
  if (memberRole === null) throw unauthorized();
  known?.remember(makers);
  if (ids.some((id) => reviewsOnly(memberRole, auth.userId, makers.get(id)))) throw forbidden(REVIEWER_READ_ONLY);
}
