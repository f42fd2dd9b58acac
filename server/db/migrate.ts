import type { Knex } from 'knex';
import { migrationConfig } from '../../knexfile';

/** Runs every pending migration; returns the names applied. */
export async function migrateLatest(db: Knex): Promise<string[]> {
  const [, applied] = await db.migrate.latest(migrationConfig);
  return applied as string[];
}

/** Rolls back every migration (used by the migration round-trip test). */
export async function migrateDownAll(db: Knex): Promise<void> {
  await db.migrate.rollback(migrationConfig, true);
}
