// /api/workbooks/:id/sheets/:sheetId/roles, …/lock and …/protected-ranges[/:rangeId]. Anyone who can
// open the workbook sees roles, locks and ranges (also in GET /api/workbooks/:id); setting and lifting
// them takes one of the lock rights (access middleware: a viewer's 403 comes before any complaint
// about the body), and the sheet's own rule is checked by the services with requireLockRight: owners
// on any sheet, editors on sheets they created and still edit.
import { Router } from 'express';
import { protectedRangeSchema, setSheetRoleSchema, sheetLockSchema, type ProtectedRange, type SheetLock, type SheetRolesResponse } from '../../shared/team.js';
import { currentUser, requireUser } from '../auth/middleware.js';
import type { AppContext } from '../context.js';
import { parse } from '../errors.js';
import { lockSheet, protectRange, unlockSheet, unprotectRange } from '../services/locks.js';
import { setSheetRole, sheetRolesOf } from '../services/sheetRoles.js';
import { accessMiddleware, accessOf, idParam } from './access.js';

export function locksRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(requireUser);
  const access = accessMiddleware(ctx);
  const lockRight = access(['lockAnySheet', 'lockOwnSheet']);

  router.get('/:id/sheets/:sheetId/roles', access('view'), (req, res) => {
    res.json(sheetRolesOf(ctx.db, accessOf(res).workbook.id, idParam(req, 'sheetId')) satisfies SheetRolesResponse);
  });

  router.put('/:id/sheets/:sheetId/roles', lockRight, (req, res) => {
    const sheetId = idParam(req, 'sheetId');
    const input = parse(setSheetRoleSchema, req.body);
    res.json(setSheetRole(ctx, accessOf(res), currentUser(res).id, sheetId, input) satisfies SheetRolesResponse);
  });

  router.put('/:id/sheets/:sheetId/lock', lockRight, (req, res) => {
    const sheetId = idParam(req, 'sheetId');
    const input = parse(sheetLockSchema, req.body);
    res.json({ lock: lockSheet(ctx, accessOf(res), currentUser(res).id, sheetId, input) } satisfies { lock: SheetLock });
  });

  router.delete('/:id/sheets/:sheetId/lock', lockRight, (req, res) => {
    unlockSheet(ctx, accessOf(res), currentUser(res).id, idParam(req, 'sheetId'));
    res.status(204).end();
  });

  router.post('/:id/sheets/:sheetId/protected-ranges', lockRight, (req, res) => {
    const sheetId = idParam(req, 'sheetId');
    const input = parse(protectedRangeSchema, req.body);
    res.status(201).json({ protectedRange: protectRange(ctx, accessOf(res), currentUser(res).id, sheetId, input) } satisfies { protectedRange: ProtectedRange });
  });

  router.delete('/:id/sheets/:sheetId/protected-ranges/:rangeId', lockRight, (req, res) => {
    unprotectRange(ctx, accessOf(res), currentUser(res).id, idParam(req, 'sheetId'), idParam(req, 'rangeId'));
    res.status(204).end();
  });

  return router;
}
