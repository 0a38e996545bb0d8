// Who shared, re-roled, locked, protected or restored what, and when, newest first.
import { Button } from '../../components/ui/Button.js';
import { Dialog } from '../../components/ui/Dialog.js';
import { Notice } from '../../components/ui/Notice.js';
import { sentence } from '../../lib/fieldErrors.js';
import { useMembers } from '../../core/team/members.js';
import { useAudit } from './api.js';
import { describeAudit } from './describeAudit.js';

const exact = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });

export function AuditDialog({ open, onClose, workbookId }: { open: boolean; onClose: () => void; workbookId: string }) {
  const audit = useAudit(workbookId, open);
  const members = useMembers(workbookId, open);
  const names = new Map((members.data ?? []).map((m) => [m.user.id, m.user.name]));
  return (
    <Dialog open={open} onClose={onClose} title="Audit log" width="w-[40rem]" footer={<Button onClick={onClose}>Close</Button>}>
      {audit.isPending ? (
        <p role="status" className="text-ink-3">
          Loading the audit log…
        </p>
      ) : audit.isError ? (
        <Notice tone="error">{sentence(audit.error.message)}</Notice>
      ) : audit.data.length === 0 ? (
        <p className="text-ink-3">Nothing recorded yet. Sharing, role changes, locks, protected ranges and restores appear here.</p>
      ) : (
        <ol aria-label="Audit entries" className="max-h-[26rem] divide-y divide-line overflow-y-auto rounded-ctl border border-line">
          {audit.data.map((e) => (
            <li key={e.id} className="flex items-baseline gap-3 px-2.5 py-1.5">
              <time dateTime={new Date(e.createdAt).toISOString()} className="w-40 shrink-0 text-caption whitespace-nowrap text-ink-3 tabular-nums">
                {exact.format(new Date(e.createdAt))}
              </time>
              <p className="min-w-0 flex-1 text-ink">
                <strong className="font-medium">{e.actor?.name ?? 'A former account'}</strong> {describeAudit(e, (id) => names.get(id))}
              </p>
            </li>
          ))}
        </ol>
      )}
    </Dialog>
  );
}
