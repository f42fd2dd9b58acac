/** `npm run migrate`: applies pending migrations to DATABASE_URL (for a deployment's own database). */
import { createDb } from '../server/db/knex';
import { migrateLatest } from '../server/db/migrate';

const url = process.env.DATABASE_URL;
if (!url) {
  console.error('Set DATABASE_URL to the database to migrate.');
  process.exit(2);
}
const db = createDb(url);
const applied = await migrateLatest(db);
console.log(applied.length ? `Applied: ${applied.join(', ')}` : 'Already up to date.');
await db.destroy();
