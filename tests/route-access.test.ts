// Every route that names a workbook goes through the one access middleware (server/routes/access.ts),
// and no route decides about roles itself: found by walking the app's router stack, so a route
// registered without access() fails here whatever file it is in.
import fs from 'node:fs';
import path from 'node:path';
import express, { Router } from 'express';
import { describe, expect, it } from 'vitest';
import { isAccessCheck } from '../server/routes/access.js';
import { makeTestApp } from './helpers/app.js';

interface FoundRoute {
  method: string;
  path: string;
  handlers: unknown[];
}

/** Every route of an Express 5 app with its full path and handlers (layers of `router`). */
function routesOf(app: express.Express): FoundRoute[] {
  const found: FoundRoute[] = [];
  const walk = (stack: any[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        const handlers = layer.route.stack.map((l: any) => l.handle);
        for (const method of Object.keys(layer.route.methods)) found.push({ method: method.toUpperCase(), path: prefix + layer.route.path, handlers });
      } else if (Array.isArray(layer.handle?.stack)) {
        walk(layer.handle.stack, prefix + (layer.rawPath === '/' ? '' : layer.rawPath));
      }
    }
  };
  walk((app as any).router.stack, '');
  return found;
}

const namesAWorkbook = (r: FoundRoute) => r.path.startsWith('/api/workbooks/:id') || r.path === '/api/imports';
const unguarded = (routes: FoundRoute[]) => routes.filter((r) => namesAWorkbook(r) && !r.handlers.some(isAccessCheck)).map((r) => `${r.method} ${r.path}`);

describe('one access path', () => {
  const routes = routesOf(makeTestApp().app);

  it('finds the workbook routes of every router (workbooks, io, locks, members, history, live)', () => {
    const paths = new Set(routes.filter(namesAWorkbook).map((r) => `${r.method} ${r.path}`));
    for (const expected of [
      'POST /api/workbooks/:id/patches',
      'GET /api/workbooks/:id/export',
      'POST /api/imports',
      'PUT /api/workbooks/:id/sheets/:sheetId/lock',
      'DELETE /api/workbooks/:id/members/:userId',
      'POST /api/workbooks/:id/invitations',
      'GET /api/workbooks/:id/revisions/:n/snapshot',
      'GET /api/workbooks/:id/events',
    ]) {
      expect(paths, expected).toContain(expected);
    }
    expect(paths.size).toBeGreaterThanOrEqual(28);
  });

  it('registers every route under /api/workbooks/:id (and /api/imports) behind access()', () => {
    expect(unguarded(routes)).toEqual([]);
  });

  it('would notice a route registered without access()', () => {
    const app = express();
    const api = Router();
    const router = Router();
    router.get('/:id/forgotten', (_req, res) => {
      res.end();
    });
    api.use('/workbooks', router);
    app.use('/api', api);
    expect(unguarded(routesOf(app))).toEqual(['GET /api/workbooks/:id/forgotten']);
  });

  it('leaves role decisions out of the route files (they ask services/access.ts through access())', () => {
    const dir = path.join(import.meta.dirname, '../server/routes');
    const decides = /\b(requireWorkbook|canAny|can|accessRoles|memberRole|requireLockRight|refusalReason|permissionTable)\s*\(/;
    const offenders: string[] = [];
    const files = fs.readdirSync(dir).filter((f) => f.endsWith('.ts') && f !== 'access.ts');
    expect(files.length).toBeGreaterThanOrEqual(10);
    for (const file of files) {
      fs.readFileSync(path.join(dir, file), 'utf8')
        .split('\n')
        .forEach((line, i) => {
          const code = line.replace(/\/\/.*$/, '');
          if (decides.test(code)) offenders.push(`${file}:${i + 1}: ${line.trim()}`);
        });
    }
    expect(offenders).toEqual([]);
  });
});
