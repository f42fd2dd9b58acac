import knexFactory, { type Knex } from 'knex';
import { createHash } from 'node:crypto';
import pg from 'pg';

// Return NUMERIC and BIGINT (count(*)) as JS numbers; our values stay well inside 2^53.
pg.types.setTypeParser(pg.types.builtins.INT8, (v) => Number(v));
pg.types.setTypeParser(pg.types.builtins.NUMERIC, (v) => Number(v));

export type Db = Knex;

export function createDb(url: string, pool = { min: 0, max: 10 }): Db {
  return knexFactory({ client: 'pg', connection: url, pool });
}

/** Reports whether the database answers, within a short time. */
export async function pingDb(db: Db, timeoutMs = 1500): Promise<boolean> {
  try {
    await Promise.race([
      db.raw('select 1'),
      new Promise((_, reject) => setTimeout(() => reject(new Error('timeout')), timeoutMs)),
    ]);
    return true;
  } catch {
    return false;
  }
}

/**
 * Runs a query as a named prepared statement, so PostgreSQL parses it once per connection and, after
 * a few runs, stops planning it again. The name is a hash of the query's SQL text (placeholders, not
 * values), so queries of the same shape share one statement and a different shape gets its own. For
 * the hot, fixed-shape queries only: each shape stays prepared on every pooled connection.
 */
export function prepared<T extends { toSQL: () => { sql: string }; options: (o: Record<string, unknown>) => T }>(query: T): T {
  const { sql } = query.toSQL();
  return query.options({ name: `bl_${createHash('sha1').update(sql).digest('base64url').slice(0, 20)}` });
}
