// /api/workbooks/:id/members and /api/workbooks/:id/invitations: who belongs to a workbook, with
// which role, and sharing by e-mail. Owners manage; any member may see the list and may leave.
import { Router } from 'express';
import { addMemberSchema, changeMemberRoleSchema, createInvitationSchema, type AddMemberResponse, type InvitationsResponse, type MemberRoleResult, type MembersResponse } from '../../shared/team.js';
import { currentUser, requireUser } from '../auth/middleware.js';
import type { AppContext } from '../context.js';
import { parse } from '../errors.js';
import { createInvitation, listPendingInvitations, revokeInvitation } from '../services/invitations.js';
import { addMember, changeMemberRole, listMembers, removeMember } from '../services/members.js';
import { findUserByEmail } from '../services/users.js';
import { idParam, workbookAccess } from './workbookAccess.js';


export function membersRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(requireUser);
  const access = workbookAccess(ctx);

  router.get('/:id/members', (req, res) => {
    const a = access(req, res, 'view');
    res.json({ members: listMembers(ctx.db, a.workbook.id) } satisfies MembersResponse);
  });

  router.post('/:id/members', async (req, res) => {
    const a = access(req, res, 'manageMembers');
    const input = parse(addMemberSchema, req.body);
    const me = currentUser(res);
    // Only an account whose owner proved the address joins at once. Anyone else, with or without an
    // account, gets the same invitation and the same 202, so the answer does not tell whether the
    // address has an account (and whoever registered it first cannot take the place of its owner).
    const account = findUserByEmail(ctx.db, input.email);
    if (account && account.emailVerifiedAt !== null && !account.disabled) {
      res.status(201).json({ member: addMember(ctx, a.workbook.id, me.id, account, input.role) } satisfies AddMemberResponse);
      return;
    }
    await ctx.limits.invitationsPerInviter.take(me.id, 'user', 'invitations');
    const invitation = await createInvitation(ctx, a.workbook.id, me, input, ctx.config.origin);
    res.status(202).json({ invitation } satisfies AddMemberResponse);
  });

  router.patch('/:id/members/:userId', (req, res) => {
    const input = parse(changeMemberRoleSchema, req.body);
    // Making someone owner hands the workbook over, a right of its own in the permission table.
    const a = access(req, res, input.role === 'owner' ? 'transferOwnership' : 'manageMembers');
    res.json(changeMemberRole(ctx, a.workbook.id, currentUser(res).id, idParam(req, 'userId'), input.role) satisfies MemberRoleResult);
  });

  router.delete('/:id/members/:userId', (req, res) => {
    const me = currentUser(res);
    const userId = idParam(req, 'userId');
    // Anyone may leave; removing someone else is the owner's.
    const a = access(req, res, userId === me.id ? 'view' : 'manageMembers');
    removeMember(ctx, a.workbook.id, me.id, userId);
    res.status(204).end();
  });

  router.get('/:id/invitations', (req, res) => {
    const a = access(req, res, 'manageMembers');
    res.json({ invitations: listPendingInvitations(ctx, a.workbook.id) } satisfies InvitationsResponse);
  });

  router.post('/:id/invitations', async (req, res) => {
    const a = access(req, res, 'manageMembers');
    const input = parse(createInvitationSchema, req.body);
    const me = currentUser(res);
    await ctx.limits.invitationsPerInviter.take(me.id, 'user', 'invitations');
    const invitation = await createInvitation(ctx, a.workbook.id, me, input, ctx.config.origin);
    res.status(201).json({ invitation });
  });

  router.delete('/:id/invitations/:invitationId', (req, res) => {
    const a = access(req, res, 'manageMembers');
    revokeInvitation(ctx, a.workbook.id, currentUser(res).id, idParam(req, 'invitationId'));
    res.status(204).end();
  });

  return router;
}
