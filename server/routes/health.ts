import type { RouteSpec } from '../http/route';
import { PUBLIC } from '../http/route';
import { pingDb } from '../db/knex';
import type { AppDeps } from '../app';
import type { Health } from '@shared/api/health';
import { APP_VERSION } from '../version';

export function healthRoutes(deps: AppDeps): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/health',
      policy: PUBLIC,
      handler: async (_req, res) => {
        const dbOk = await pingDb(deps.db);
        const body: Health = { status: dbOk ? 'ok' : 'degraded', db: dbOk ? 'ok' : 'down', version: APP_VERSION };
        res.status(dbOk ? 200 : 503).json(body);
      },
    },
  ];
}
