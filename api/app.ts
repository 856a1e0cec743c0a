import { existsSync } from 'node:fs';
import path from 'node:path';
import cookieParser from 'cookie-parser';
import express, { type Express } from 'express';
import helmet from 'helmet';
import type { Kysely } from 'kysely';
import type { Logger } from 'pino';
import { pinoHttp } from 'pino-http';
import { authOperations } from './auth/auth.openapi';
import { authRouter } from './auth/auth.router';
import type { SessionCache } from './auth/session-cache';
import { authenticate } from './auth/authenticate';
import type { Config } from './config';
import type { Database } from './db/database';
import { healthOperations, healthRouter } from './health/health.router';
import { errorHandler, notFoundHandler } from './http/error-handler';
import { buildOpenApiDocument } from './openapi/document';
import { docsRouter } from './openapi/docs.router';
import type { Operation } from './openapi/operation';
import { auditRouter } from './audit/audit.router';
import { datasetOperations } from './datasets/dataset.openapi';
import { datasetRouter } from './datasets/dataset.router';
import { designOperations } from './designs/design.openapi';
import { designRouter } from './designs/design.router';
import type { Outbox } from './mail/outbox';
import { mailboxRouter } from './mailbox/mailbox.router';
import { reportRouter } from './reports/report.router';
import { reviewOperations } from './reviews/review.openapi';
import { reviewRouter } from './reviews/review.router';
import { userOperations } from './users/user.openapi';
import { userRouter } from './users/user.router';

export interface AppDeps {
  config: Config;
  db: Kysely<Database>;
  logger: Logger;
  version: string;
  /** Delivers queued mail; without one, mail waits in the outbox for a process that has it. */
  outbox?: Outbox | null;
  /** Remembers live sessions between requests; without one, every request asks the database. */
  sessions?: SessionCache | null;
}

export const operations: Operation[] = [...healthOperations, ...authOperations, ...userOperations, ...designOperations, ...reviewOperations, ...datasetOperations];

/** Builds the whole HTTP application; `api/main.ts` only listens. */
export function createApp({ config, db, logger, version, outbox = null, sessions = null }: AppDeps): Express {
  const app = express();
  app.disable('x-powered-by');
  app.disable('etag');
  if (config.trustProxy) app.set('trust proxy', config.trustProxy);

  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          baseUri: ["'self'"],
          scriptSrc: ["'self'"],
          scriptSrcAttr: ["'none'"],
          styleSrc: ["'self'", "'unsafe-inline'"],
          fontSrc: ["'self'", 'data:'],
          imgSrc: ["'self'", 'data:', 'blob:'],
          connectSrc: ["'self'"],
          workerSrc: ["'self'", 'blob:'],
          objectSrc: ["'none'"],
          frameAncestors: ["'none'"],
          formAction: ["'self'"],
        },
      },
      // HSTS only means something over TLS; the local server speaks plain HTTP on loopback.
      strictTransportSecurity: config.cookieSecure,
    }),
  );
  app.use(pinoHttp({ logger, autoLogging: { ignore: (req) => req.url === '/api/health' } }));

  let document: unknown;
  const api = express.Router();
  // Answers of the API are the signed-in user's data: no browser or proxy cache may keep them (and
  // so an ETag, a hash of every body, would buy nothing).
  api.use((_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });
  api.use(express.json({ limit: config.bodyLimit }));
  api.use(cookieParser());
  api.use(healthRouter(db, version));
  api.use(docsRouter(() => (document ??= buildOpenApiDocument(operations, version))));
  api.use(authenticate(db, config, sessions));
  api.use(authRouter(db, config, sessions));
  api.use(userRouter(db, config, sessions));
  api.use(designRouter(db, version));
  api.use(datasetRouter(db));
  api.use(reviewRouter(db, config, outbox));
  api.use(auditRouter(db));
  api.use(reportRouter(db, version));
  api.use(mailboxRouter(db));
  api.use(notFoundHandler);
  app.use('/api', api);

  const indexFile = path.join(config.staticDir, 'index.html');
  if (existsSync(indexFile)) {
    app.use(express.static(config.staticDir, { index: false, maxAge: '1h' }));
    // History fallback: every other GET is a client-side route of the single-page app.
    app.get('/{*splat}', (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache');
      // The configured folder is trusted even when its path has a dot folder in it (e.g. a .tmp build).
      res.sendFile(indexFile, { dotfiles: 'allow' });
    });
  }
  app.use(notFoundHandler);
  app.use(errorHandler);
  return app;
}
