// The people with access to a workbook. Owners change roles, remove people and hand the workbook
// over; everyone else sees the list and may leave. Destructive steps ask inline, inside the share
// dialog, instead of stacking a second modal on top of it.
import { useState } from 'react';
import type { Member } from '../../../shared/team.js';
import { roleLabels, type WorkbookRole } from '../../../shared/permissions.js';
import { Button } from '../../components/ui/Button.js';
import { sentence } from '../../lib/fieldErrors.js';
import { useChangeMemberRole, useRemoveMember } from './api.js';


type Pending = { kind: 'remove' | 'transfer'; member: Member } | null;

export function MemberList({ workbookId, members, myId, canManage, onLeft }: { workbookId: string; members: Member[]; myId: string; canManage: boolean; onLeft: () => void }) {
  const changeRole = useChangeMemberRole(workbookId);
  const remove = useRemoveMember(workbookId);
  const [asking, setAsking] = useState<Pending>(null);
  const error = changeRole.error ?? remove.error;
  const busyId = changeRole.isPending ? changeRole.variables?.userId : remove.isPending ? remove.variables : undefined;

  const confirm = () => {
    if (!asking) return;
    const done = { onSuccess: () => setAsking(null) };
    if (asking.kind === 'transfer') changeRole.mutate({ userId: asking.member.user.id, role: 'owner' }, done);
    else remove.mutate(asking.member.user.id, { onSuccess: () => (setAsking(null), asking.member.user.id === myId && onLeft()) });
  };

  return (
    <section aria-labelledby="members-heading">
      <h3 id="members-heading" className="mb-1 text-caption font-semibold tracking-wide text-ink-3 uppercase">
        People with access
      </h3>
      {error && (
        <p role="alert" className="mb-1.5 text-caption text-danger">
          {sentence(error.message)}
        </p>
      )}
      <ul className="flex flex-col divide-y divide-line rounded-ctl border border-line">
        {members.map((m) => {
          const me = m.user.id === myId;
          const isAsking = asking?.member.user.id === m.user.id;
          return (
            <li key={m.user.id} aria-label={m.user.name} aria-busy={busyId === m.user.id || undefined} className="px-2.5 py-1.5">
              <div className="flex items-center gap-2">
                <div className="min-w-0 flex-1">
                  <p className="truncate font-medium text-ink">
                    {m.user.name}
                    {me && <span className="ml-1 text-caption font-normal text-ink-3">(you)</span>}
                  </p>
                  <p className="truncate text-caption text-ink-3">{m.user.email}</p>
                </div>
                {canManage && m.role !== 'owner' ? (
                  <>
                    <select
                      aria-label={`Role of ${m.user.name}`}
                      value={m.role}
                      disabled={busyId === m.user.id}
                      onChange={(e) => changeRole.mutate({ userId: m.user.id, role: e.target.value as WorkbookRole })}
                      className="h-7 rounded-ctl border border-line-strong bg-surface px-1.5 text-ui text-ink"
                    >
                      <option value="editor">Editor</option>
                      <option value="viewer">Viewer</option>
                    </select>
                    <Button variant="ghost" onClick={() => setAsking({ kind: 'transfer', member: m })} aria-label={`Make ${m.user.name} the owner`}>
                      Make owner
                    </Button>
                    <Button variant="ghost" className="hover:text-danger" onClick={() => setAsking({ kind: 'remove', member: m })} aria-label={`Remove ${m.user.name}`}>
                      Remove
                    </Button>
                  </>
                ) : (
                  <>
                    <span className="text-ink-2">{roleLabels[m.role]}</span>
                    {me && m.role !== 'owner' && (
                      <Button variant="ghost" className="hover:text-danger" onClick={() => setAsking({ kind: 'remove', member: m })}>
                        Leave
                      </Button>
                    )}
                  </>
                )}
              </div>
              {isAsking && asking && (
                <div role="group" aria-label="Confirm" className="mt-1.5 flex items-center gap-2 rounded-ctl bg-caution-soft px-2 py-1.5 text-ink">
                  <p className="flex-1 text-caption">
                    {asking.kind === 'transfer'
                      ? `Make ${m.user.name} the owner? You become an editor and can no longer share, lock any sheet or delete the workbook.`
                      : me
                        ? 'Leave this workbook? You lose access until an owner shares it again.'
                        : `Remove ${m.user.name}? They lose access at once, and their name comes off every lock and protected range.`}
                  </p>
                  <Button onClick={() => setAsking(null)}>Cancel</Button>
                  <Button variant={asking.kind === 'transfer' ? 'primary' : 'danger'} busy={busyId === m.user.id} onClick={confirm}>
                    {asking.kind === 'transfer' ? 'Transfer ownership' : me ? 'Leave' : 'Remove'}
                  </Button>
                </div>
              )}
            </li>
          );
        })}
      </ul>
    </section>
  );
}
