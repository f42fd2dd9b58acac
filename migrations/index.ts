/**
 * The ordered list of migrations. Knex would find them by reading this folder, but the tests and
 * `npm start` load TypeScript through their own loaders, so the list is explicit: add each new
 * migration file here, at the end. Never edit a migration that has shipped; add a new one.
 */
import type { Knex } from 'knex';
import * as organisationsUsers from './20261201000000_organisations_users';

const migrations: Record<string, Knex.Migration> = {
  '20261201000000_organisations_users': organisationsUsers,
};

export const migrationSource: Knex.MigrationSource<string> = {
  getMigrations: async () => Object.keys(migrations),
  getMigrationName: (name) => name,
  getMigration: async (name) => migrations[name],
};
