/**
 * The ordered list of migrations. Knex would find them by reading this folder, but the tests and
 * `npm start` load TypeScript through their own loaders, so the list is explicit: add each new
 * migration file here, at the end. Never edit a migration that has shipped; add a new one.
 */
import type { Knex } from 'knex';
import * as organisationsUsers from './20261201000000_organisations_users';
import * as accounts from './20261201000100_accounts';
import * as surveys from './20261201000200_surveys';
import * as photos from './20261201000300_photos';
import * as review from './20261201000400_review';
import * as resultsAsJson from './20261201000500_results_as_json';
import * as lz4Toast from './20261202000600_lz4_toast';
import * as docsAsJson from './20261202000700_docs_as_json';
import * as refreshSuccessors from './20261202000800_refresh_successors';
import * as rateLimits from './20261203001300_rate_limits';
import * as surveyFormatV2 from './20261203001500_survey_format_v2';
import * as commentResolution from './20261203001700_comment_resolution';
import * as briefAcknowledgements from './20261203001750_brief_acknowledgements';
import * as changedSinceReview from './20261204000100_changed_since_review';
import * as deviceOwners from './20261204000200_device_owners';
import * as endedSessions from './20261204000210_ended_sessions';

const migrations: Record<string, Knex.Migration> = {
  '20261201000000_organisations_users': organisationsUsers,
  '20261201000100_accounts': accounts,
  '20261201000200_surveys': surveys,
  '20261201000300_photos': photos,
  '20261201000400_review': review,
  '20261201000500_results_as_json': resultsAsJson,
  '20261202000600_lz4_toast': lz4Toast,
  '20261202000700_docs_as_json': docsAsJson,
  '20261202000800_refresh_successors': refreshSuccessors,
  '20261203001300_rate_limits': rateLimits,
  '20261203001500_survey_format_v2': surveyFormatV2,
  '20261203001700_comment_resolution': commentResolution,
  '20261203001750_brief_acknowledgements': briefAcknowledgements,
  '20261204000100_changed_since_review': changedSinceReview,
  '20261204000200_device_owners': deviceOwners,
  '20261204000210_ended_sessions': endedSessions,
};

export const migrationSource: Knex.MigrationSource<string> = {
  getMigrations: async () => Object.keys(migrations),
  getMigrationName: (name) => name,
  getMigration: async (name) => migrations[name],
};
