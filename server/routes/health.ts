// GET /api/health: what a load balancer needs (ok or degraded, and the version) for anyone; the
// details behind the verdict (database, migrations, mail transport) only for site admins, since
// they name internals such as the dev inbox's port. `details` is an object so more checks can join.
import fs from 'node:fs';
import path from 'node:path';
import type { RequestHandler } from 'express';
import type { SessionUser } from '../auth/middleware.js';
import type { AppContext } from '../context.js';
import { migrationStatus } from '../db/index.js';
import type { StorageHealth } from '../services/storageHealth.js';

export const appVersion: string = (JSON.parse(fs.readFileSync(path.resolve(import.meta.dirname, '../../package.json'), 'utf8')) as { version: string }).version;

export interface HealthDetails {
  database: string;
  migrations: ReturnType<typeof migrationStatus> | null;
  mail: string;
  /** Whether writes fail (a full disk, an I/O error): see services/storageHealth.ts. */
  storage?: ReturnType<StorageHealth['status']>;
}

export interface HealthResponse {
  status: 'ok' | 'degraded';
  version: string;
  /** Site admins only. */
  details?: HealthDetails;
}

export function healthRoute(ctx: AppContext, storage?: StorageHealth): RequestHandler {
  return (_req, res) => {
    let database = 'ok';
    let migrations: HealthDetails['migrations'] = null;
    try {
      ctx.db.$client.prepare('select 1').get();
      migrations = migrationStatus(ctx.db);
    } catch (e) {
      database = `error: ${(e as Error).message}`;
    }
    const writes = storage?.status();
    const ok = database === 'ok' && migrations?.current === true && (writes === undefined || writes.writes === 'ok');
    const body: HealthResponse = { status: ok ? 'ok' : 'degraded', version: appVersion };
    const user = res.locals.user as SessionUser | null;
    if (user?.siteRole === 'admin') body.details = { database, migrations, mail: ctx.mail.status(), ...(writes ? { storage: writes } : {}) };
    res.status(ok ? 200 : 503).json(body);
  };
}
