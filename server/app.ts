/**
 * Builds the Express app from its dependencies. No `listen` here: server/index.ts listens, and the
 * tests start the same app on a random port.
 */
import express, { Router } from 'express';
import cookieParser from 'cookie-parser';
import compression from 'compression';
import expressStaticGzip from 'express-static-gzip';
import fs from 'node:fs';
import path from 'node:path';
import type { AppContext, AppDeps } from './context';
import { defineRoutes, type RegisteredRoute, type RouteSpec } from './http/route';
import { apiNotFound, errorHandler } from './middleware/errors';
import { requestLogging } from './http/request-log';
import { securityHeaders } from './http/security-headers';
import { sameOrigin } from './http/same-origin';
import { createSignInGuard, resetRequestLimits } from './http/rate-limit';
import { createMailer } from './mail/mailer';
import { createS3PhotoStorage } from './storage/photo-store';
import { createServices, type AppServices } from './services';
import { jsonBody } from './http/json-body';
import { healthRoutes } from './routes/health';
import { authRoutes, REFRESH_COOKIE_PATH } from './routes/auth';
import { memberRoutes } from './routes/members';
import { devMailRoutes } from './routes/dev-mail';
import { surveyRoutes } from './routes/surveys';
import { reviewRoutes } from './routes/review';
import { briefPageRoutes } from './routes/brief-page';
import { photoRoutes } from './routes/photos';

export type { AppDeps } from './context';

/** API answers smaller than this go uncompressed. */
export const API_COMPRESSION_THRESHOLD_BYTES = 1024;

export interface BrinelineApp extends express.Express {
  locals: express.Express['locals'] & { routes: RegisteredRoute[] };
}

/** The API route groups, each a function of the services it uses. */
function routeGroups(s: AppServices, deps: AppContext): RouteSpec[][] {
  const { config } = deps;
  const authEdge = {
    secure: config.publicUrl.startsWith('https:'),
    origin: sameOrigin(config),
    signInGuard: createSignInGuard(deps.db, config),
    resetLimits: resetRequestLimits(deps.db, config),
  };
  return [
    healthRoutes(s.health),
    authRoutes(s, authEdge),
    memberRoutes(s),
    devMailRoutes(s.devMail),
    surveyRoutes(s),
    reviewRoutes(s),
    photoRoutes(s.photos),
  ];
}

/** Pages served outside /api and the app shell (the master's brief); registered before the SPA fallback. */
function pageGroups(s: AppServices): RouteSpec[][] {
  return [briefPageRoutes(s.briefs)];
}

/** The /api router: no-store answers, the JSON body parser, compression, every API route group, a JSON 404. */
function apiRouter(services: AppServices, deps: AppContext, registry: RegisteredRoute[]): Router {
  const api = Router();
  // API answers are for one caller at one moment: no cache (a shared proxy, the browser's disk) may
  // keep them. Routes that serve bytes meant to be cached (photos) set their own header.
  api.use((_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });
  api.use(jsonBody({ limit: '5mb' }));
  // JSON answers above 1 KB go gzip- or brotli-compressed when the client accepts it (a survey read is
  // tens of KB; an answer of a few bytes gains nothing from a compression header)
  api.use(compression({ threshold: API_COMPRESSION_THRESHOLD_BYTES }));
  for (const group of routeGroups(services, deps)) defineRoutes(api, '/api', group, services.access, registry);
  api.use(apiNotFound);
  return api;
}

/** The built client, when there is one: its precompressed files, and index.html for every other page. */
function serveClient(app: BrinelineApp, clientDir: string | undefined): void {
  if (!clientDir || !fs.existsSync(path.join(clientDir, 'index.html'))) return;
  // brotli and gzip copies are made at build time (vite-plugin-compression2): the server only picks one
  app.use(
    expressStaticGzip(clientDir, {
      enableBrotli: true,
      orderPreference: ['br', 'gzip'],
      index: false,
      serveStatic: {
        index: false,
        setHeaders: (res, served) => {
          const file = served.replace(/\.(br|gz)$/, '');
          if (file.endsWith('sw.js') || file.endsWith('index.html') || file.endsWith('.webmanifest')) {
            res.setHeader('Cache-Control', 'no-cache');
          } else if (file.includes(`${path.sep}assets${path.sep}`)) {
            // hashed names: a changed file is a new name, so a year is safe
            res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
          }
        },
      },
    }),
  );
  app.get(/^\/(?!api\/).*/, (_req, res) => {
    res.setHeader('Cache-Control', 'no-cache');
    // `root` keeps send's dot-folder check to the part below clientDir (tests build into .tmp/…).
    res.sendFile('index.html', { root: clientDir });
  });
}

/** The composition root: resolves the optional dependencies, builds every service once, registers the routes. */
export function createApp(given: AppDeps): BrinelineApp {
  const deps: AppContext = { ...given, mailer: given.mailer ?? createMailer(given.config), storage: given.storage ?? createS3PhotoStorage(given.config) };
  const services = createServices(deps);
  const app = express() as BrinelineApp;
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  // No ETag hashing of every API body (a survey read is ~65 KB): clients never revalidate /api
  // answers, and the service worker leaves /api alone. Static files keep their own ETags.
  app.set('etag', false);
  app.locals.routes = [];

  app.use(requestLogging(deps.logger));
  app.use(securityHeaders());
  // Only the refresh cookie is read, and browsers send it to /api/auth alone (REFRESH_COOKIE_PATH).
  app.use(REFRESH_COOKIE_PATH, cookieParser());
  app.use('/api', apiRouter(services, deps, app.locals.routes));

  const pages = Router();
  for (const group of pageGroups(services)) defineRoutes(pages, '', group, services.access, app.locals.routes);
  app.use(pages);
  serveClient(app, deps.clientDir);

  app.use(errorHandler);
  return app;
}
