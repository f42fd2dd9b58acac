import knexFactory, { type Knex } from 'knex';
import pg from 'pg';

// Return NUMERIC and BIGINT (count(*)) as JS numbers; our values stay well inside 2^53.
pg.types.setTypeParser(pg.types.builtins.INT8, (v) => Number(v));
pg.types.setTypeParser(pg.types.builtins.NUMERIC, (v) => Number(v));

export type Db = Knex;

const urls = new WeakMap<Db, string>();

export function createDb(url: string, pool = { min: 0, max: 10 }): Db {
  const db = knexFactory({ client: 'pg', connection: url, pool });
  urls.set(db, url);
  return db;
}

/** The connection string a Db was made with (createDb), for a worker thread to open its own connection. */
export function databaseUrlOf(db: Db): string {
  const url = urls.get(db);
  if (!url) throw new Error('This database handle was not made by createDb.');
  return url;
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

/** A fixed SQL text (`?` placeholders) under its prepared-statement name, with the text node-postgres sends. */
interface NamedStatement {
  sql: string;
  text: string;
}
const namedStatements = new Map<string, NamedStatement>();

/**
 * Runs fixed SQL text with `?` placeholders as the named prepared statement `name`: parsed once per
 * connection, and after a few runs no longer planned. Outside a transaction the query goes straight
 * to a pooled connection's node-postgres client: the text never changes, so it is put into
 * PostgreSQL's `$n` form once per name (by knex's own rule), not on every run, and knex's per-query
 * work (formatting, bindings checks, its query runner) is skipped; the pool is still knex's. Inside a
 * transaction it goes through the transaction as any query. A name must always mean the same text:
 * a different text under a known name throws.
 */
export async function runNamed<R extends object = Record<string, unknown>>(
  q: Knex | Knex.Transaction,
  name: string,
  sql: string,
  values: readonly Knex.RawBinding[],
): Promise<pg.QueryResult<R>> {
  let st = namedStatements.get(name);
  if (!st) {
    st = { sql, text: (q.client as { positionBindings: (sql: string) => string }).positionBindings(sql) };
    namedStatements.set(name, st);
  } else if (st.sql !== sql) {
    throw new Error(`The prepared statement "${name}" was given a different SQL text.`);
  }
  if ((q as Knex.Transaction).isTransaction) return (await q.raw(sql, values).options({ name })) as pg.QueryResult<R>;
  const client = q.client as { acquireConnection: () => Promise<pg.Client>; releaseConnection: (c: pg.Client) => Promise<void> };
  const conn = await client.acquireConnection();
  try {
    return await conn.query<R>({ name, text: st.text, values: values as unknown[] });
  } finally {
    await client.releaseConnection(conn);
  }
}
