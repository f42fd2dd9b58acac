/** Whether the app can reach its database, for the health route and load balancers. */
import type { Health } from '@shared/api/health';
import { pingDb, type Db } from '../db/knex';
import { APP_VERSION } from '../version';

export function createHealthService(deps: { db: Db }) {
  return {
    async check(): Promise<Health> {
      const dbOk = await pingDb(deps.db);
      return { status: dbOk ? 'ok' : 'degraded', db: dbOk ? 'ok' : 'down', version: APP_VERSION };
    },
  };
}

export type HealthService = ReturnType<typeof createHealthService>;
