// /api/invitations/:token: what an e-mailed link offers (readable without signing in, so the page can
// say "sign up or sign in as …"), and accepting it (signed in, with the invited address).
import { Router } from 'express';
import { z } from 'zod';
import type { AcceptInvitationResponse, InvitationPreview } from '../../shared/team.js';
import { currentUser, requireUser } from '../auth/middleware.js';
import type { AppContext } from '../context.js';
import { parse } from '../errors.js';
import { acceptInvitation, previewInvitation } from '../services/invitations.js';

/** 32 random bytes in base64url are 43 characters; anything else cannot be one of ours. */
const tokenSchema = z.string().regex(/^[A-Za-z0-9_-]{43}$/, 'not an invitation token; open the link from the e-mail again');

export function invitationLinksRouter(ctx: AppContext): Router {
  const router = Router();

  router.get('/:token', (req, res) => {
    res.json(previewInvitation(ctx, parse(tokenSchema, req.params.token, 'token')) satisfies InvitationPreview);
  });

  router.post('/:token/accept', requireUser, (req, res) => {
    const token = parse(tokenSchema, req.params.token, 'token');
    res.json(acceptInvitation(ctx, currentUser(res), token) satisfies AcceptInvitationResponse);
  });

  return router;
}
