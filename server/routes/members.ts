// /api/workbooks/:id/members and /api/workbooks/:id/invitations: who belongs to a workbook, with
// which role, and sharing by e-mail (services/sharing.ts). Owners manage; any member may see the
// list and may leave.
import { Router, type Request } from 'express';
import type { SessionUser } from '../auth/middleware.js';
import { addMemberSchema, changeMemberRoleSchema, createInvitationSchema, type AddMemberResponse, type InvitationsResponse, type MemberRoleResult, type MembersResponse } from '../../shared/team.js';
import { currentUser, requireUser } from '../auth/middleware.js';
import type { AppContext } from '../context.js';
import { parse } from '../errors.js';
import { listPendingInvitations, revokeInvitation } from '../services/invitations.js';
import { changeMemberRole, listMembers, removeMember } from '../services/members.js';
import { inviteByEmail, shareWorkbook } from '../services/sharing.js';
import { accessMiddleware, accessOf, idParam } from './access.js';

// Making someone owner hands the workbook over, a right of its own in the permission table.
const roleChangeRight = (req: Request) => (parse(changeMemberRoleSchema, req.body).role === 'owner' ? 'transferOwnership' : 'manageMembers');
// Anyone may leave; removing someone else is the owner's.
const removalRight = (req: Request, me: SessionUser) => (idParam(req, 'userId') === me.id ? 'view' : 'manageMembers');

export function membersRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(requireUser);
  const access = accessMiddleware(ctx);

  router.get('/:id/members', access('view'), (_req, res) => {
    res.json({ members: listMembers(ctx.db, accessOf(res).workbook.id) } satisfies MembersResponse);
  });

  router.post('/:id/members', access('manageMembers'), async (req, res) => {
    const input = parse(addMemberSchema, req.body);
    const shared = await shareWorkbook(ctx, accessOf(res).workbook.id, currentUser(res), input);
    res.status('member' in shared ? 201 : 202).json(shared satisfies AddMemberResponse);
  });

  router.patch('/:id/members/:userId', access(roleChangeRight), (req, res) => {
    const { role } = parse(changeMemberRoleSchema, req.body);
    res.json(changeMemberRole(ctx, accessOf(res).workbook.id, currentUser(res).id, idParam(req, 'userId'), role) satisfies MemberRoleResult);
  });

  router.delete('/:id/members/:userId', access(removalRight), (req, res) => {
    removeMember(ctx, accessOf(res).workbook.id, currentUser(res).id, idParam(req, 'userId'));
    res.status(204).end();
  });

  router.get('/:id/invitations', access('manageMembers'), (_req, res) => {
    res.json({ invitations: listPendingInvitations(ctx, accessOf(res).workbook.id) } satisfies InvitationsResponse);
  });

  router.post('/:id/invitations', access('manageMembers'), async (req, res) => {
    const input = parse(createInvitationSchema, req.body);
    res.status(201).json({ invitation: await inviteByEmail(ctx, accessOf(res).workbook.id, currentUser(res), input) });
  });

  router.delete('/:id/invitations/:invitationId', access('manageMembers'), (req, res) => {
    revokeInvitation(ctx, accessOf(res).workbook.id, currentUser(res).id, idParam(req, 'invitationId'));
    res.status(204).end();
  });

  return router;
}
