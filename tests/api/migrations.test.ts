import { describe, expect, it, inject } from 'vitest';
import { randomBytes } from 'node:crypto';
import { createDb } from '../../server/db/knex';
import { migrateDownAll, migrateLatest } from '../../server/db/migrate';

// Every migration must go up and come back down cleanly. This runs on a database of its own in the
// test cluster, so the other test files keep their schema while it rolls back.
describe('migrations', () => {
  it('apply, roll back completely and apply again', async () => {
    const base = inject('testEnv').DATABASE_URL;
    const name = `brineline_mig_${randomBytes(4).toString('hex')}`;
    const admin = createDb(base);
    await admin.raw(`CREATE DATABASE ${name}`);
    const url = new URL(base);
    url.pathname = `/${name}`;
    const db = createDb(url.toString());
    try {
      const first = await migrateLatest(db);
      expect(first.length).toBeGreaterThan(0);
      await migrateDownAll(db);
      const { rows } = await db.raw(
        "SELECT table_name FROM information_schema.tables WHERE table_schema = 'public' AND table_name NOT LIKE 'knex_%'",
      );
      expect(rows).toEqual([]);
      const again = await migrateLatest(db);
      expect(again).toEqual(first);
    } finally {
      await db.destroy();
      await admin.raw(`DROP DATABASE ${name}`);
      await admin.destroy();
    }
  });
});
