/**
 * Builds the Express app from its dependencies. No `listen` here: server/index.ts listens, and the
 * tests start the same app on a random port.
 */
import express, { Router, type Request } from 'express';
import helmet from 'helmet';
import cookieParser from 'cookie-parser';
import { pinoHttp } from 'pino-http';
import type { Logger } from 'pino';
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import type { Db } from './db/knex';
import type { Config } from './config';
import { defineRoutes, type RegisteredRoute, type RouteSpec, type AccessVerifier } from './http/route';
import { apiNotFound, errorHandler } from './middleware/errors';
import { healthRoutes } from './routes/health';
import { createAccessVerifier } from './services/access';

export interface AppDeps {
  db: Db;
  config: Config;
  logger: Logger;
  /** Folder with the built client (index.html and assets); not served when absent. */
  clientDir?: string;
}

export interface BrinelineApp extends express.Express {
  locals: express.Express['locals'] & { routes: RegisteredRoute[] };
}

/** The API route groups, each a function of the app's dependencies. */
function routeGroups(deps: AppDeps): RouteSpec[][] {
  return [healthRoutes(deps)];
}

export function createApp(deps: AppDeps): BrinelineApp {
  const app = express() as BrinelineApp;
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.locals.routes = [];

  app.use(
    pinoHttp({
      logger: deps.logger,
      genReqId: (req, res) => {
        const given = req.headers['x-request-id'];
        const id = typeof given === 'string' && /^[\w-]{8,64}$/.test(given) ? given : randomUUID();
        res.setHeader('x-request-id', id);
        return id;
      },
      autoLogging: { ignore: (req) => (req as Request).url === '/api/health' },
    }),
  );
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          'img-src': ["'self'", 'data:', 'blob:'],
          'worker-src': ["'self'", 'blob:'],
          'script-src': ["'self'", "'wasm-unsafe-eval'"],
        },
      },
    }),
  );
  app.use(cookieParser());

  const verify: AccessVerifier = createAccessVerifier(deps);
  const api = Router();
  api.use(express.json({ limit: '5mb' }));
  for (const group of routeGroups(deps)) defineRoutes(api, '/api', group, verify, app.locals.routes);
  api.use(apiNotFound);
  app.use('/api', api);

  if (deps.clientDir && fs.existsSync(path.join(deps.clientDir, 'index.html'))) {
    const clientDir = deps.clientDir;
    app.use(
      express.static(clientDir, {
        index: false,
        setHeaders: (res, file) => {
          if (file.endsWith('sw.js') || file.endsWith('index.html') || file.endsWith('.webmanifest')) {
            res.setHeader('Cache-Control', 'no-cache');
          } else if (file.includes(`${path.sep}assets${path.sep}`)) {
            res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
          }
        },
      }),
    );
    app.get(/^\/(?!api\/).*/, (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(path.join(clientDir, 'index.html'));
    });
  }

  app.use(errorHandler);
  return app;
}
