import fs from 'node:fs';
import path from 'node:path';
import express, { type Express } from 'express';
import type { AppConfig } from './config.js';
import type { Db } from './db/index.js';
import { migrationStatus } from './db/index.js';
import { createLucia } from './auth/lucia.js';
import { checkOrigin, loadSession } from './auth/middleware.js';
import type { AppContext } from './context.js';
import { errorHandler, notFoundApi } from './errors.js';

export interface CreateAppOptions {
  db: Db;
  config: AppConfig;
}

export function createApp({ db, config }: CreateAppOptions): { app: Express; ctx: AppContext } {
  const ctx: AppContext = { db, config, lucia: createLucia(db) };
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');

  const api = express.Router();
  api.use(express.json({ limit: '2mb' }));
  api.use(checkOrigin(config.origin));
  api.use(loadSession(ctx.lucia));

  api.get('/health', (_req, res) => {
    let database = 'ok';
    let migrations: unknown = null;
    try {
      db.$client.prepare('select 1').get();
      migrations = migrationStatus(db);
    } catch (e) {
      database = `error: ${(e as Error).message}`;
    }
    const ok = database === 'ok' && (migrations as { current?: boolean })?.current === true;
    res.status(ok ? 200 : 503).json({ status: ok ? 'ok' : 'degraded', database, migrations });
  });

  // Feature routers mount here.

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
