import { PUBLIC, type RouteSpec } from '../http/route';
import type { HealthService } from '../services/health';

export function healthRoutes(health: HealthService): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/health',
      policy: PUBLIC,
      handler: async (_req, res) => {
        const body = await health.check();
        res.status(body.db === 'ok' ? 200 : 503).json(body);
      },
    },
  ];
}
