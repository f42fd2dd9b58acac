import knexFactory, { type Knex } from 'knex';
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
