/**
 * Pull: pages through the organisation's rows by the id of the transaction that last wrote them
 * (xid8). The cursor it hands back is the oldest transaction still running when it read, so a
 * transaction that commits late is still picked up next time (a row may come twice; never zero times).
 */
import type { PullQuery, PullResponse } from '@shared/schemas/sync';
import type { Knex } from 'knex';
import type { Db } from '../../db/knex';
import type { AuthContext } from '../../http/auth-context';
import { snapshotXmin, surveysChangedSince } from '../../db/repositories/pull';
import { conflictsSince } from '../../db/repositories/conflicts';
import { pullExtraSources } from '../pull-extras';

interface Cursor {
  floor: string;
  after?: [string, string];
}

function parseCursor(s: string): Cursor {
  const [floor, xid, id] = s.split(':');
  return xid && id ? { floor, after: [xid, id] } : { floor };
}

const minXid = (a: string, b: string) => (BigInt(a) <= BigInt(b) ? a : b);

/** Conflicts and extras come with the first page of a round (they are small). */
async function firstPageExtras(trx: Knex.Transaction, auth: AuthContext, since: string): Promise<Pick<PullResponse, 'conflicts' | 'extras'>> {
  const conflicts = await conflictsSince(trx, auth.orgId, since);
  const extras: Record<string, unknown[]> = {};
  for (const [name, source] of Object.entries(pullExtraSources)) {
    extras[name] = await source(trx, { orgId: auth.orgId, userId: auth.userId, role: auth.role, sinceXid: since });
  }
  return { conflicts, extras };
}

export async function pull(db: Db, auth: AuthContext, q: PullQuery): Promise<PullResponse> {
  const cursor = parseCursor(q.cursor);
  return db.transaction(
    async (trx) => {
      const xmin = await snapshotXmin(trx);
      const rows = await surveysChangedSince(trx, auth.orgId, cursor.after ? { after: cursor.after } : { floor: cursor.floor }, q.limit + 1);
      const hasMore = rows.length > q.limit;
      const page = rows.slice(0, q.limit);
      // Carry forward the lowest "still running" mark seen during the paging, so nothing is skipped.
      const floor = cursor.after ? minXid(cursor.floor, xmin) : xmin;
      const last = page[page.length - 1];
      const next = hasMore ? `${floor}:${last.xid}:${last.id}` : floor;
      const { conflicts, extras } = cursor.after ? { conflicts: [], extras: {} } : await firstPageExtras(trx, auth, cursor.floor);
      return {
        cursor: next,
        hasMore,
        surveys: page.map(({ xid: _xid, ...s }) => s),
        conflicts,
        extras,
        serverTime: new Date().toISOString(),
      };
    },
    { isolationLevel: 'repeatable read', readOnly: true },
  );
}
