/**
 * Whether the app can reach its database, for the health route and load balancers. Asked often (a
 * balancer, and every offline device probing every 2.5 s), so one ping answers every request that
 * arrives while it runs and for FRESH_MS after: health never queues a query per request behind a
 * busy database, and stays quick while the engine pool is working.
 */
import type { Health } from '@shared/api/health';
import { pingDb, type Db } from '../db/knex';
import { APP_VERSION } from '../version';

const FRESH_MS = 250;

export function createHealthService(deps: { db: Db }) {
  let last: { at: number; ok: boolean } | undefined;
  let inFlight: Promise<boolean> | undefined;
  const dbOk = (): Promise<boolean> => {
    if (last && performance.now() - last.at < FRESH_MS) return Promise.resolve(last.ok);
    inFlight ??= pingDb(deps.db).then((ok) => {
      last = { at: performance.now(), ok };
      inFlight = undefined;
      return ok;
    });
    return inFlight;
  };
  return {
    async check(): Promise<Health> {
      const ok = await dbOk();
      return { status: ok ? 'ok' : 'degraded', db: ok ? 'ok' : 'down', version: APP_VERSION };
    },
  };
}

export type HealthService = ReturnType<typeof createHealthService>;
