// Invitations sent by e-mail and not yet accepted, with a way to withdraw each (owners only).
import type { Invitation } from '../../../shared/team.js';
import { Button } from '../../components/ui/Button.js';
import { sentence } from '../../lib/fieldErrors.js';
import { useRevokeInvitation } from './api.js';
import { roleLabels } from '../../../shared/permissions.js';

const dateFormat = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });

export function InvitationList({ workbookId, invitations }: { workbookId: string; invitations: Invitation[] }) {
  const revoke = useRevokeInvitation(workbookId);
  if (invitations.length === 0) return null;
  return (
    <section aria-labelledby="invitations-heading" className="mt-3">
      <h3 id="invitations-heading" className="mb-1 text-caption font-semibold tracking-wide text-ink-3 uppercase">
        Pending invitations
      </h3>
      {revoke.isError && (
        <p role="alert" className="mb-1.5 text-caption text-danger">
          {sentence(revoke.error.message)}
        </p>
      )}
      <ul className="flex flex-col divide-y divide-line rounded-ctl border border-line">
        {invitations.map((inv) => (
          <li key={inv.id} aria-label={`Invitation to ${inv.email}`} className="flex items-center gap-2 px-2.5 py-1.5">
            <div className="min-w-0 flex-1">
              <p className="truncate text-ink">{inv.email}</p>
              <p className="truncate text-caption text-ink-3">
                {roleLabels[inv.role]} · invited by {inv.invitedBy.name} · expires {dateFormat.format(new Date(inv.expiresAt))}
              </p>
            </div>
            <Button
              variant="ghost"
              className="hover:text-danger"
              busy={revoke.isPending && revoke.variables === inv.id}
              onClick={() => revoke.mutate(inv.id)}
              aria-label={`Revoke the invitation to ${inv.email}`}
            >
              Revoke
            </Button>
          </li>
        ))}
      </ul>
    </section>
  );
}
