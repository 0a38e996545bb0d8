// The one access step of every workbook route: access('editCells') validates :id, asks
// services/access.ts (the one place that decides) whether the signed-in user may do that, answers
// 401/404/403 through the error handler when not, and leaves the workbook and the user's roles on
// res.locals.access for the handler (read with accessOf(res)). A route never checks a role itself;
// tests/route-access.test.ts fails when a route under /api/workbooks/:id is registered without it.
import type { Request, RequestHandler, Response } from 'express';
import { z } from 'zod';
import type { WorkbookAction } from '../../shared/permissions.js';
import { idSchema } from '../../shared/workbooks.js';
import { currentUser, type SessionUser } from '../auth/middleware.js';
import type { AppContext } from '../context.js';
import { parse } from '../errors.js';
import { requireWorkbook, type WorkbookAccess } from '../services/access.js';

declare global {
  namespace Express {
    interface Locals {
      /** Set by access(): the workbook the request acts on and the roles the user acts with. */
      access?: WorkbookAccess;
    }
  }
}

/** What the request must be allowed: one action, any one of several, or one that depends on the request (its body, its other params). */
export type AccessRule = WorkbookAction | readonly WorkbookAction[] | ((req: Request, user: SessionUser) => WorkbookAction | readonly WorkbookAction[]);

export interface AccessOptions {
  /**
   * Where the workbook id comes from; by default the :id path parameter. Returning undefined means
   * the request names no workbook (an import into a new one), and nothing is checked.
   *
   */
  workbookId?: (req: Request) => string | undefined;
  /**
   * The sheet the route acts on: services/access.ts then decides with the user's role on that sheet
   * as well as in the workbook (404 for a sheet of another workbook, 403 when they only view it).
   */
  sheet?: (req: Request) => string;
}

const workbookParams = z.object({ id: idSchema });
const accessChecks = new WeakSet<RequestHandler>();

/** Builds the access() middleware for one app. */
export function accessMiddleware(ctx: AppContext) {
  return function access(rule: AccessRule, options: AccessOptions = {}): RequestHandler {
    const check: RequestHandler = (req, res, next) => {
      const user = currentUser(res);
      const workbookId = options.workbookId ? options.workbookId(req) : parse(workbookParams, req.params, 'params').id;
      if (workbookId === undefined) return next();
      res.locals.access = requireWorkbook(ctx, user, workbookId, typeof rule === 'function' ? rule(req, user) : rule, { sheetId: options.sheet?.(req) });
      next();
    };
    accessChecks.add(check);
    return check;
  };
}

/** Whether a handler is an access() check (for the test that every workbook route has one). */
export function isAccessCheck(handler: unknown): boolean {
  return typeof handler === 'function' && accessChecks.has(handler as RequestHandler);
}

/** What access() found for this request; a handler mounted without access() is a bug, so it throws. */
export function accessOf(res: Response): WorkbookAccess {
  const found = res.locals.access;
  if (!found) throw new Error('accessOf: this route is mounted without the access() middleware');
  return found;
}

/** Validates one more path parameter as an id, naming it in the 400. */
export function idParam(req: Request, name: string): string {
  return parse(idSchema, req.params[name], name);
}

/** A revision number in a path (:n): a whole number, 0 or more. */
export const revisionNumberSchema = z.coerce.number({ error: 'must be a whole number' }).int('must be a whole number').min(0, 'must be 0 or more');
