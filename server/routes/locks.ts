// /api/workbooks/:id/sheets/:sheetId/roles, …/lock and …/protected-ranges[/:rangeId]. Anyone who can
// open the workbook sees roles, locks and ranges (also in GET /api/workbooks/:id); setting and lifting
// them is checked by requireLockRight (services/access.ts): owners on any sheet, editors on sheets
// they created and still edit.
import { Router } from 'express';
import { protectedRangeSchema, setSheetRoleSchema, sheetLockSchema, type ProtectedRange, type SheetLock, type SheetRolesResponse } from '../../shared/team.js';
import { currentUser, requireUser } from '../auth/middleware.js';
import type { AppContext } from '../context.js';
import { parse } from '../errors.js';
import { requireLockRight } from '../services/access.js';
import { lockSheet, protectRange, unlockSheet, unprotectRange } from '../services/locks.js';
import { setSheetRole, sheetRolesOf } from '../services/sheetRoles.js';
import { idParam, workbookAccess } from './workbookAccess.js';

export function locksRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(requireUser);
  const access = workbookAccess(ctx);

  router.get('/:id/sheets/:sheetId/roles', (req, res) => {
    const a = access(req, res, 'view');
    res.json(sheetRolesOf(ctx.db, a.workbook.id, idParam(req, 'sheetId')) satisfies SheetRolesResponse);
  });

  router.put('/:id/sheets/:sheetId/roles', (req, res) => {
    const a = access(req, res, 'view');
    requireLockRight(a, currentUser(res).id); // a viewer's 403 comes before any complaint about the body
    const sheetId = idParam(req, 'sheetId');
    const input = parse(setSheetRoleSchema, req.body);
    res.json(setSheetRole(ctx, a, currentUser(res).id, sheetId, input) satisfies SheetRolesResponse);
  });

  router.put('/:id/sheets/:sheetId/lock', (req, res) => {
    const a = access(req, res, 'view');
    requireLockRight(a, currentUser(res).id); // a viewer's 403 comes before any complaint about the body
    const sheetId = idParam(req, 'sheetId');
    const input = parse(sheetLockSchema, req.body);
    res.json({ lock: lockSheet(ctx, a, currentUser(res).id, sheetId, input) } satisfies { lock: SheetLock });
  });

  router.delete('/:id/sheets/:sheetId/lock', (req, res) => {
    const a = access(req, res, 'view');
    requireLockRight(a, currentUser(res).id); // a viewer's 403 comes before any complaint about the body
    unlockSheet(ctx, a, currentUser(res).id, idParam(req, 'sheetId'));
    res.status(204).end();
  });

  router.post('/:id/sheets/:sheetId/protected-ranges', (req, res) => {
    const a = access(req, res, 'view');
    requireLockRight(a, currentUser(res).id); // a viewer's 403 comes before any complaint about the body
    const sheetId = idParam(req, 'sheetId');
    const input = parse(protectedRangeSchema, req.body);
    res.status(201).json({ protectedRange: protectRange(ctx, a, currentUser(res).id, sheetId, input) } satisfies { protectedRange: ProtectedRange });
  });

  router.delete('/:id/sheets/:sheetId/protected-ranges/:rangeId', (req, res) => {
    const a = access(req, res, 'view');
    requireLockRight(a, currentUser(res).id); // a viewer's 403 comes before any complaint about the body
    unprotectRange(ctx, a, currentUser(res).id, idParam(req, 'sheetId'), idParam(req, 'rangeId'));
    res.status(204).end();
  });

  return router;
}
