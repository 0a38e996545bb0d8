import { maxBodyBytes } from '../shared/workbooks.js';
import fs from 'node:fs';
import path from 'node:path';
import express, { type Express } from 'express';
import type { AppConfig } from './config.js';
import type { Db } from './db/index.js';
import { createLucia } from './auth/lucia.js';
import { checkOrigin, loadSession } from './auth/middleware.js';
import type { AppContext } from './context.js';
import { errorHandler, notFoundApi } from './errors.js';
import { createAccountLimits, type AttemptLimit, type LimitName } from './auth/rateLimit.js';
import { securityHeaders } from './securityHeaders.js';
import { healthRoute } from './routes/health.js';
import { createHttpLogger, createLogger, resolveLogLevel } from './logging.js';
import { authRouter } from './routes/auth.js';
import { adminUsersRouter } from './routes/admin.js';
import { workbooksRouter } from './routes/workbooks.js';
import { structuresRouter } from './routes/structures.js';
import { createEventHub } from './services/events.js';
import { createMailer } from './mail/mailer.js';
import { teamRouter } from './routes/team.js';
import { invitationLinksRouter } from './routes/invitations.js';
import { adminTeamRouter } from './routes/adminTeam.js';
import { ioRouter } from './routes/io.js';
import { createStorageHealth } from './services/storageHealth.js';

export interface CreateAppOptions {
  db: Db;
  config: AppConfig;
  /** Tighter or looser attempt limits (tests). */
  limits?: Partial<Record<LimitName, AttemptLimit>>;
}

export function createApp({ db, config, limits }: CreateAppOptions): { app: Express; ctx: AppContext } {
  const logger = createLogger(config.logLevel ?? resolveLogLevel(process.env));
  const ctx: AppContext = { db, config, lucia: createLucia(db), limits: createAccountLimits(limits), logger, events: createEventHub((err) => logger.error({ err }, 'workbook event listener failed')), mail: createMailer({ db, smtpUrl: config.smtpUrl, from: config.mailFrom, logger }) };
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use(createHttpLogger(logger));
  app.use(securityHeaders(config));
  // Storage failures (full disk, I/O errors) noted by the error handler and reported by /api/health.
  const storage = createStorageHealth(config.databasePath);
  app.locals.storageHealth = storage;

  const api = express.Router();
  api.use(express.json({ limit: maxBodyBytes }));
  api.use(checkOrigin(config));
  api.use(loadSession(ctx.lucia));

  api.get('/health', healthRoute(ctx, storage));

  // Feature routers mount here.
  api.use('/auth', authRouter(ctx));
  api.use('/admin', adminUsersRouter(ctx));
  api.use('/workbooks', workbooksRouter(ctx));
  api.use('/workbooks', teamRouter(ctx));
  api.use('/workbooks', structuresRouter(ctx));
  api.use('/invitations', invitationLinksRouter(ctx));
  api.use('/admin', adminTeamRouter(ctx));
  api.use(ioRouter(ctx));

  api.use(notFoundApi);
  api.use(errorHandler);
  app.use('/api', api);

  if (config.production && fs.existsSync(config.clientDir)) {
    app.use(express.static(config.clientDir, { index: false, maxAge: '1h' }));
    app.get('/{*splat}', (_req, res) => res.sendFile(path.join(config.clientDir, 'index.html')));
  }
  app.use(errorHandler);
  return { app, ctx };
}
