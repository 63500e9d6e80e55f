import { existsSync } from 'node:fs';
import path from 'node:path';
import express, { Router, type Express } from 'express';
import compression from 'compression';
import type PgBoss from 'pg-boss';
import type { Config } from './config';
import type { Database } from './db/client';
import type { Logger } from './logger';
import { csrfProtection } from './auth/csrf';
import type { OidcClient } from './auth/oidc';
import { authRouter, loadUser, requireUser } from './auth/routes';
import { sessionMiddleware } from './auth/session';
import { databaseUnavailable, errorHandler, notFoundHandler } from './http/problem';
import { checkPathParams, inputGuard } from './http/edge';
import { requestLog } from './http/request-log';
import { securityHeaders } from './http/security-headers';
import type { EnginePool } from './engine/pool';
import type { JobEvents } from './jobs/events';
import { jobsRouter } from './jobs/routes';
import { JobService } from './jobs/service';
import { NotebookService } from './notebook/service';
import { projectsRouter } from './projects/routes';
import { studiesRouter } from './studies/routes';
import { versionsRouter } from './versions/routes';
import { branchesRouter, draftBodyParser } from './branches/routes';
import { uploadsRouter } from './uploads/routes';
import { commentsRouter } from './comments/routes';
import { compareRouter } from './compare/routes';
import { inboxRouter } from './inbox/routes';
import { meRouter } from './me/routes';
import { threadsRouter } from './threads/routes';
import { devMailRouter } from './mail/dev-routes';
import { methodsRouter } from './methods/routes';
import { openapiRouter } from './openapi/routes';
import { bearerAuth } from './tokens/bearer';
import { compressedFiles, HASHED_NAME } from './web-static/compressed-files';

export interface AppDeps {
  config: Config;
  database: Database;
  logger: Logger;
  oidc: OidcClient;
  /** The engine's worker-thread pool; its owner (main.ts, the test app) closes it. */
  engine: EnginePool;
  /** The job queue (pg-boss, started by the owner) and the ear on the workers' notices. */
  jobs: { boss: PgBoss; events: JobEvents };
}

/**
 * Builds the Express app without listening, so tests mount it with supertest. main.ts starts it.
 */
export function createApp(deps: AppDeps): Express {
  const { config, database, logger } = deps;
  const db = database.db;
  const app = express();
  app.disable('x-powered-by');
  if (config.PUBLIC_URL.startsWith('https://')) app.set('trust proxy', 1);

  app.use(requestLog(logger));
  // helmet's headers, worked out once from these fixed options (http/security-headers.ts).
  app.use(
    securityHeaders({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          // Angular and Material put component styles in <style> elements; plot libraries set inline styles.
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'", 'data:'],
          connectSrc: ["'self'"],
          workerSrc: ["'self'", 'blob:'],
          objectSrc: ["'none'"],
          baseUri: ["'self'"],
          frameAncestors: ["'none'"],
          formAction: ["'self'"],
        },
      },
      crossOriginOpenerPolicy: { policy: 'same-origin' },
      // HSTS only means something over https; on a loopback http address it would only confuse.
      strictTransportSecurity: config.PUBLIC_URL.startsWith('https://'),
    }),
  );

  app.get('/healthz', async (_req, res) => {
    await database.pool.query('select 1').catch(() => {
      throw databaseUnavailable();
    });
    res.json({ status: 'ok' });
  });

  // In production the built Angular app is served from the same origin as the API, ahead of the body
  // parsers, the session and the user: a file of the app needs neither, and a cold open fetches dozens.
  // Sent compressed (gzip or Brotli, on the thread pool; a content-hashed file once, then from memory:
  // web-static/compressed-files.ts); files whose names carry their content hash
  // never change, so browsers keep them a year without asking again; index.html is asked for every time.
  const web = path.resolve(config.WEB_DIST);
  if (existsSync(path.join(web, 'index.html'))) {
    const appFiles = express.Router();
    appFiles.use(compressedFiles(web));
    appFiles.use(compression());
    appFiles.use(
      express.static(web, {
        index: false,
        setHeaders: (res, file) => res.setHeader('cache-control', HASHED_NAME.test(path.basename(file)) ? 'public, max-age=31536000, immutable' : 'no-cache'),
      }),
    );
    appFiles.get(/^\/(?!api\/|auth\/).*/, (_req, res) => {
      res.setHeader('cache-control', 'no-cache');
      res.sendFile(path.join(web, 'index.html'));
    });
    // The API, its event streams and the sign-in routes never pass through here (nor the compression).
    app.use((req, res, next) => (/^\/(api|auth)(\/|$)/.test(req.path) ? next() : appFiles(req, res, next)));
  }

  app.use('/api/branches', draftBodyParser);
  app.use(express.json({ limit: '2mb' }));
  app.use(sessionMiddleware(config, database.pool));
  app.use(loadUser(db));
  // A personal API token (Authorization: Bearer) stands in for the session on /api.
  app.use('/api', ...bearerAuth({ db, pool: database.pool, logger, perMinute: config.API_TOKEN_RATE_PER_MINUTE }));
  // Anonymous calls answer 401 before anything else is looked at; then anti-forgery.
  app.use('/api', requireUser, csrfProtection(config.PUBLIC_URL));
  app.use('/auth/logout', csrfProtection(config.PUBLIC_URL));
  // Hostile input (NUL, broken Unicode, deep nesting, non-finite numbers, unknown cell inputs) answers
  // 400 here, for every route, before any handler or the database sees it.
  app.use(inputGuard);
  app.use('/auth', authRouter({ config, db, pool: database.pool, oidc: deps.oidc, logger }));

  const api = Router();
  const notebook = new NotebookService(db, deps.engine, logger);
  const jobs = new JobService(db, database.pool, deps.jobs.boss, notebook);
  // One router per resource: /api/<name> is served by server/src/<name>/routes.ts.
  api.use('/me', meRouter({ db }));
  api.use('/projects', projectsRouter({ db }));
  api.use('/studies', studiesRouter({ db, config, notebook }));
  api.use('/branches', branchesRouter({ db, notebook, jobs, events: deps.jobs.events }));
  api.use('/versions', versionsRouter({ db, config }));
  api.use('/threads', threadsRouter({ db, config }));
  api.use('/comments', commentsRouter({ db, config }));
  api.use('/inbox', inboxRouter({ db }));
  api.use('/compare', compareRouter({ db }));
  api.use('/uploads', uploadsRouter({ db }));
  api.use('/jobs', jobsRouter({ db, jobs }));
  api.use('/methods', methodsRouter());
  api.use(devMailRouter({ config }));
  api.use('/openapi.json', openapiRouter({ config }));
  api.use(notFoundHandler);
  app.use('/api', api);

  app.use(notFoundHandler);
  app.use(errorHandler(logger));
  // Every path parameter of every route mounted above is checked (ids must be ids).
  checkPathParams(app);
  return app;
}
