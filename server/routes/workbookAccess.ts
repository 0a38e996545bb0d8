// The access step every workbook-scoped route of the team features starts with: validate :id, then
// ask services/access.ts (the one place that decides) whether the signed-in user may do `action`.
import type { Request, Response } from 'express';
import { z } from 'zod';
import type { WorkbookAction } from '../../shared/permissions.js';
import { idSchema } from '../../shared/workbooks.js';
import { currentUser } from '../auth/middleware.js';
import type { AppContext } from '../context.js';
import { parse } from '../errors.js';
import { requireWorkbook, type WorkbookAccess } from '../services/access.js';

const workbookParams = z.object({ id: idSchema });

export function workbookAccess(ctx: AppContext) {
  return (req: Request, res: Response, action: WorkbookAction): WorkbookAccess => {
    const { id } = parse(workbookParams, req.params, 'params');
    return requireWorkbook(ctx, currentUser(res), id, action);
  };
}

/** Validates one more path parameter as an id, naming it in the 400. */
export function idParam(req: Request, name: string): string {
  return parse(idSchema, req.params[name], name);
}

/** A revision number in a path (:n): a whole number, 0 or more. */
export const revisionNumberSchema = z.coerce.number({ error: 'must be a whole number' }).int('must be a whole number').min(0, 'must be 0 or more');
