/** The sync service: push and pull, with this server's memory of the surveys it last wrote, of device owners and of survey makers. */
import type { PullQuery, SurveyChange } from '@shared/schemas/sync';
import type { Db } from '../../db/knex';
import type { AuthContext } from '../../http/auth-context';
import type { ResultsScheduler } from '../results-scheduler';
import { push, type PushOptions } from './push';
import { pull } from './pull';
import { SurveyStateCache } from './state-cache';
import { DeviceOwners } from './device-owners';
import { SurveyMakers } from '../editing';

export function createSyncService(deps: { db: Db; scheduler?: ResultsScheduler }) {
  const known = new SurveyStateCache();
  const devices = new DeviceOwners(deps.db);
  const makers = new SurveyMakers();
  return {
    push: (auth: AuthContext, changes: SurveyChange[], opts: Pick<PushOptions, 'logger' | 'confirm' | 'roles'> = {}) =>
      push(deps.db, auth, changes, { ...opts, scheduler: deps.scheduler, known, devices, makers }),
    pull: (auth: AuthContext, q: PullQuery) => pull(deps.db, auth, q),
  };
}

export type SyncService = ReturnType<typeof createSyncService>;
