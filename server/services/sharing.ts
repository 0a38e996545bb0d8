// Sharing a workbook by e-mail address. Only an account whose owner proved the address joins at
// once. Anyone else, with or without an account, gets the same invitation and the same answer, so it
// does not tell whether the address has an account (and whoever registered it first cannot take the
// place of its owner). Invitations count against the inviter's attempt limit before any mail goes.
import type { AddMemberInput, AddMemberResponse, Invitation } from '../../shared/team.js';
import type { AppContext } from '../context.js';
import { createInvitation } from './invitations.js';
import { addMember } from './members.js';
import { findUserByEmail } from './users.js';

type Inviter = { id: string; name: string; email: string };

export async function inviteByEmail(ctx: AppContext, workbookId: string, inviter: Inviter, input: AddMemberInput): Promise<Invitation> {
  await ctx.limits.invitationsPerInviter.take(inviter.id, 'user', 'invitations');
  return createInvitation(ctx, workbookId, inviter, input, ctx.config.origin);
}

/** Adds the account at `input.email` as a member ({ member }) or invites the address ({ invitation }). */
export async function shareWorkbook(ctx: AppContext, workbookId: string, inviter: Inviter, input: AddMemberInput): Promise<AddMemberResponse> {
  const account = findUserByEmail(ctx.db, input.email);
  if (account && account.emailVerifiedAt !== null && !account.disabled) return { member: addMember(ctx, workbookId, inviter.id, account, input.role) };
  return { invitation: await inviteByEmail(ctx, workbookId, inviter, input) };
}
