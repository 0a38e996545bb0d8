// History: every revision with its author and time; pick one to see the workbook as it was right after
// it (read-only), and restore it. A restore is itself a new revision, so nothing in between is lost.
import { useState } from 'react';
import { allows, type WorkbookAction } from '@shared/permissions.js';
import type { RevisionKind, RevisionSummary } from '@shared/workbooks.js';
import { Button } from '../../components/ui/Button.js';
import { Dialog } from '../../components/ui/Dialog.js';
import { Notice } from '../../components/ui/Notice.js';
import { sentence } from '../../lib/fieldErrors.js';
import { timeAgo } from '../../lib/relativeTime.js';
import { useRestoreRevision, useRevisions, useRevisionSnapshot } from './api.js';
import { RevisionSnapshotView } from './RevisionSnapshotView.js';

const kindLabels: Record<RevisionKind, string> = { edit: 'Cell edits', sheet: 'Sheet change', restore: 'Restore', import: 'Import' };
const exact = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'medium' });

function RevisionRow({ r, selected, onSelect }: { r: RevisionSummary; selected: boolean; onSelect: () => void }) {
  return (
    <li>
      <button
        type="button"
        aria-current={selected || undefined}
        aria-label={`Revision ${r.number}`}
        onClick={onSelect}
        className={`flex w-full flex-col items-start px-2.5 py-1.5 text-left ${selected ? 'bg-accent-soft' : 'hover:bg-hover'}`}
      >
        <span className="flex w-full items-baseline gap-2">
          <span className="font-mono text-caption text-ink-3">#{r.number}</span>
          <span className="font-medium text-ink">{kindLabels[r.kind]}</span>
          <span className="ml-auto text-caption text-ink-3 tabular-nums" title={exact.format(new Date(r.createdAt))}>
            {timeAgo(r.createdAt)}
          </span>
        </span>
        <span className="text-caption text-ink-2">
          {r.author?.name ?? 'a former account'} · {r.changeCount} {r.changeCount === 1 ? 'change' : 'changes'}
        </span>
      </button>
    </li>
  );
}

export function HistoryDialog({ open, onClose, workbookId, actions }: { open: boolean; onClose: () => void; workbookId: string; actions: WorkbookAction[] }) {
  const list = useRevisions(workbookId, open);
  const [selected, setSelected] = useState<number | null>(null);
  const [confirming, setConfirming] = useState(false);
  const snapshot = useRevisionSnapshot(workbookId, open ? selected : null);
  const restore = useRestoreRevision(workbookId);
  const current = list.data?.revision;

  const select = (n: number) => {
    setSelected(n);
    setConfirming(false);
    restore.reset();
  };

  return (
    <Dialog open={open} onClose={onClose} title="History" width="w-[60rem]" footer={<Button onClick={onClose}>Close</Button>}>
      <div className="flex h-[30rem] gap-3">
        <div className="flex w-64 shrink-0 flex-col overflow-hidden rounded-ctl border border-line">
          {list.isPending ? (
            <p role="status" className="p-2.5 text-ink-3">
              Loading revisions…
            </p>
          ) : list.isError ? (
            <Notice tone="error" className="m-2">
              {sentence(list.error.message)}
            </Notice>
          ) : list.data.revisions.length === 0 ? (
            <p className="p-2.5 text-ink-3">No revisions yet: nothing has been saved.</p>
          ) : (
            <ul aria-label="Revisions" className="min-h-0 flex-1 divide-y divide-line overflow-y-auto">
              {list.data.revisions.map((r) => (
                <RevisionRow key={r.number} r={r} selected={r.number === selected} onSelect={() => select(r.number)} />
              ))}
            </ul>
          )}
        </div>
        <div className="flex min-w-0 flex-1 flex-col gap-2">
          {selected === null ? (
            <p className="m-auto text-ink-3">Pick a revision to see the workbook as it was right after it.</p>
          ) : (
            <>
              <div className="flex items-center gap-2">
                <p className="flex-1 text-ink">
                  As of revision <strong>#{selected}</strong>
                  {selected === current && <span className="text-ink-3"> (the current state)</span>} · read-only
                </p>
                {allows(actions, 'restore') && selected !== current && !confirming && <Button onClick={() => setConfirming(true)}>Restore this revision…</Button>}
              </div>
              {confirming && (
                <div role="group" aria-label="Confirm restore" className="flex items-center gap-2 rounded-ctl border border-caution-line bg-caution-soft px-3 py-2 text-ink">
                  <p className="flex-1 text-caption">
                    Bring the workbook back to how it was right after #{selected}? This is saved as a new revision; the later ones stay in the history and can be restored too.
                  </p>
                  <Button onClick={() => setConfirming(false)}>Cancel</Button>
                  <Button variant="primary" busy={restore.isPending} onClick={() => restore.mutate(selected, { onSuccess: () => setConfirming(false) })}>
                    Restore #{selected}
                  </Button>
                </div>
              )}
              {restore.isError && <Notice tone="error">{sentence(restore.error.message)}</Notice>}
              {restore.isSuccess && <Notice tone="success">Restored as revision #{restore.data.revision} ({restore.data.changeCount} changes).</Notice>}
              <div className="flex min-h-0 flex-1 flex-col overflow-hidden rounded-ctl border border-line">
                {snapshot.isPending ? (
                  <p role="status" className="p-2.5 text-ink-3">
                    Loading revision #{selected}…
                  </p>
                ) : snapshot.isError ? (
                  <Notice tone="error" className="m-2">
                    {sentence(snapshot.error.message)}
                  </Notice>
                ) : (
                  <RevisionSnapshotView key={selected} snapshot={snapshot.data} />
                )}
              </div>
            </>
          )}
        </div>
      </div>
    </Dialog>
  );
}
