// /invitations/:token, the page an e-mailed link opens. Readable signed out: it says who invited whom
// to what, then asks the invitee to sign up or sign in with the invited address and come back here.
import { Link, useNavigate, useParams } from 'react-router';
import type { InvitationPreview } from '@shared/team.js';
import { Button } from '../../components/ui/Button.js';
import { Notice } from '../../components/ui/Notice.js';
import { ApiError } from '../../lib/api.js';
import { sentence } from '../../lib/fieldErrors.js';
import { useMe, useSignOut } from '../../core/session/me.js';
import { AuthFrame } from '../../components/ui/AuthFrame.js';
import { useAcceptInvitation, useInvitationLink } from './api.js';
import { workbookPath } from '@shared/workbooks.js';

const closedStatus: Record<Exclude<InvitationPreview['status'], 'pending'>, string> = {
  accepted: 'This invitation has already been used. Each link works once; if you accepted it, the workbook is in your list.',
  revoked: 'This invitation was withdrawn by the workbook’s owner, or replaced by a newer one.',
  expired: 'This invitation has expired. Ask the owner to send a new one.',
};

export function InvitationPage() {
  const token = useParams().token ?? '';
  const link = useInvitationLink(token);
  const me = useMe();
  const accept = useAcceptInvitation(token);
  const signOut = useSignOut();
  const navigate = useNavigate();
  const here = `/invitations/${encodeURIComponent(token)}`;
  const next = `?next=${encodeURIComponent(here)}`;

  let body;
  if (link.isPending || me.isPending) {
    body = (
      <p role="status" className="text-ink-3">
        Reading the invitation…
      </p>
    );
  } else if (link.isError) {
    const gone = link.error instanceof ApiError && (link.error.status === 404 || link.error.status === 400);
    body = (
      <Notice tone="error" title={gone ? 'This link does not lead to an invitation' : 'Could not read the invitation'}>
        {sentence(link.error.message)}
      </Notice>
    );
  } else {
    const inv = link.data;
    const user = me.data;
    body = (
      <div className="flex flex-col gap-3">
        <p className="text-ink-2">
          <strong className="text-ink">{inv.invitedBy.name}</strong> invited <strong className="text-ink">{inv.email}</strong> to the workbook{' '}
          <strong className="text-ink">“{inv.workbook.title}”</strong> as {inv.role === 'editor' ? 'an editor' : 'a viewer'}.
        </p>
        {inv.status !== 'pending' ? (
          <Notice tone="caution">{closedStatus[inv.status]}</Notice>
        ) : !user ? (
          <>
            <p className="text-ink-2">Sign up or sign in with {inv.email} to accept it.</p>
            <div className="flex gap-2">
              <Link to={`/sign-up${next}`} className="inline-flex h-8 flex-1 items-center justify-center rounded-ctl bg-accent font-medium text-on-accent hover:bg-accent-strong">
                Create account
              </Link>
              <Link to={`/sign-in${next}`} className="inline-flex h-8 flex-1 items-center justify-center rounded-ctl border border-line-strong font-medium text-ink hover:bg-hover">
                Sign in
              </Link>
            </div>
          </>
        ) : user.email !== inv.email ? (
          <>
            <Notice tone="caution" title="Signed in with another address">
              You are signed in as {user.email}. Sign in as {inv.email} to accept this invitation.
            </Notice>
            <Button busy={signOut.isPending} onClick={() => signOut.mutate(undefined, { onSuccess: () => navigate(`/sign-in${next}`) })}>
              Sign out and switch account
            </Button>
          </>
        ) : (
          <>
            {accept.isError && <Notice tone="error">{sentence(accept.error.message)}</Notice>}
            <Button
              variant="primary"
              className="h-8"
              busy={accept.isPending}
              onClick={() => accept.mutate(undefined, { onSuccess: (r) => navigate(workbookPath(r.workbookId), { replace: true }) })}
            >
              Accept and open the workbook
            </Button>
          </>
        )}
      </div>
    );
  }

  return (
    <AuthFrame
      title="Invitation to a workbook"
      footer={
        <Link to="/" className="font-medium text-accent hover:underline">
          Go to your workbooks
        </Link>
      }
    >
      <title>Invitation · Orbitab</title>
      {body}
    </AuthFrame>
  );
}
