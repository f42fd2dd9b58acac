import { afterAll, describe, expect, it, inject } from 'vitest';
import { createDb, runNamed } from '../../server/db/knex';

// runNamed sends fixed SQL straight to a pooled connection outside a transaction and through the
// transaction inside one; both must give what knex's own raw query gives.
describe('runNamed', () => {
  const db = createDb(inject('testEnv').DATABASE_URL, { min: 0, max: 2 });
  afterAll(() => db.destroy());
  const SQL = `SELECT ?::int + ?::int AS sum, ?::text[] AS list, ?::text IS NULL AS none, ? AS word`;
  const values = [2, 3, ['a', 'b'], null, 'x'];

  it('answers as knex.raw does, outside and inside a transaction, many times on a small pool', async () => {
    const expected = (await db.raw(SQL, values)).rows;
    expect(expected).toEqual([{ sum: 5, list: ['a', 'b'], none: true, word: 'x' }]);
    const outside = await Promise.all(Array.from({ length: 20 }, () => runNamed(db, 'bl_test_sum', SQL, values)));
    for (const r of outside) expect(r.rows).toEqual(expected);
    const inside = await db.transaction((trx) => runNamed(trx, 'bl_test_sum', SQL, values));
    expect(inside.rows).toEqual(expected);
  });

  it('refuses another text under a name already used', async () => {
    await runNamed(db, 'bl_test_once', 'SELECT 1 AS one', []);
    await expect(runNamed(db, 'bl_test_once', 'SELECT 2 AS one', [])).rejects.toThrow(/different SQL text/);
  });

  it('gives the connection back to the pool when the query fails', async () => {
    for (let i = 0; i < 5; i++) {
      await expect(runNamed(db, 'bl_test_fail', 'SELECT 1 / ?::int AS x', [0])).rejects.toMatchObject({ code: '22012' });
    }
    expect((await runNamed(db, 'bl_test_fail', 'SELECT 1 / ?::int AS x', [1])).rows).toEqual([{ x: 1 }]);
  });
});
