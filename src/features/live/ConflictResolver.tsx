// Mount point for conflicts: the dialog opens by itself when the save queue reports a 409, and a
// slim banner stays until the choice is made (after "Decide later" too).
import { useEffect, useState } from 'react';
import type { SaveStatus } from '../../core/workbook/save/patchQueue.js';
import type { WorkbookSession } from '../../core/workbook/session/useWorkbookSession.js';
import { ConflictDialog } from './ConflictDialog.js';
import { conflictKey, type SetAsideInput } from './conflictResolution.js';

export function ConflictResolver({ session, status, onSetAside }: { session: WorkbookSession; status: SaveStatus; onSetAside: (inputs: SetAsideInput[]) => void }) {
  const conflicts = status.kind === 'conflict' ? status.conflicts : null;
  const signature = conflicts?.map(conflictKey).join('|') ?? '';
  const [open, setOpen] = useState(true);
  useEffect(() => {
    if (signature) setOpen(true);
  }, [signature]);
  if (status.kind !== 'conflict') return null;
  const n = status.conflicts.length;
  return (
    <>
      <div role="alert" data-grid-shield="" className="flex shrink-0 items-center gap-3 border-b border-danger-line bg-danger-soft px-3 py-1 text-caption text-ink">
        <span className="font-medium text-danger">Not saved:</span>
        <span>
          someone else changed {n === 1 ? 'a cell' : `${n} cells`} you edited. Your {n === 1 ? 'input stays' : 'inputs stay'} here until you choose.
        </span>
        <button type="button" onClick={() => setOpen(true)} className="ml-auto h-6 rounded-ctl border border-line-strong bg-surface px-2 font-medium hover:bg-hover">
          Choose…
        </button>
      </div>
      <ConflictDialog key={signature} session={session} status={status} open={open} onClose={() => setOpen(false)} onSetAside={onSetAside} />
    </>
  );
}
