// A 409 from the save queue, shown as a choice per cell: their input (already saved by a colleague)
// or mine (still waiting here). Keeping mine sends it again on top of theirs, which stays in the
// history; taking theirs shows it here and sets mine aside, where it can still be copied.
import { useState } from 'react';
import type { CellConflict } from '../../../shared/workbooks.js';
import { Button } from '../../components/ui/Button.js';
import { Dialog } from '../../components/ui/Dialog.js';
import type { SaveStatus } from '../../core/workbook/save/patchQueue.js';
import type { WorkbookSession } from '../../core/workbook/session/useWorkbookSession.js';
import { cellAddress } from '../../../shared/a1.js';
import { conflictKey, describeInput, type ConflictChoice, type SetAsideInput } from './conflictResolution.js';
import { settleConflicts } from './settleConflicts.js';

type ConflictStatus = Extract<SaveStatus, { kind: 'conflict' }>;

function Value({ label, input, tone }: { label: string; input: string; tone: 'theirs' | 'mine' }) {
  return (
    <div className="min-w-0 flex-1">
      <p className="text-caption text-ink-3">{label}</p>
      <p data-value={tone} className={`truncate rounded-ctl border px-2 py-1 font-mono text-ink ${tone === 'mine' ? 'border-accent-line bg-accent-soft' : 'border-line bg-raised'}`} title={input}>
        {describeInput(input)}
      </p>
    </div>
  );
}

export function ConflictDialog({
  session,
  status,
  open,
  onClose,
  onSetAside,
}: {
  session: WorkbookSession;
  status: ConflictStatus;
  open: boolean;
  onClose: () => void;
  onSetAside: (inputs: SetAsideInput[]) => void;
}) {
  const { model, queue } = session;
  const [choices, setChoices] = useState<Record<string, ConflictChoice>>({});
  const conflicts = status.conflicts;
  const many = conflicts.length > 1;
  const choiceOf = (c: CellConflict) => choices[conflictKey(c)] ?? 'mine';
  // I may have typed in a conflicting cell again while deciding: that input is the one at stake.
  const latest = new Map(queue.waiting.map((c) => [conflictKey(c), c.input]));
  const sheetName = (id: string) => (model.hasSheet(id) ? model.sheet(id).name : 'deleted sheet');

  const settle = (choose: ConflictChoice | ((c: CellConflict) => ConflictChoice)) => {
    const setAside = settleConflicts(session, conflicts, choose);
    if (setAside.length > 0) onSetAside(setAside.map((c) => ({ ...c })));
    setChoices({});
    onClose();
  };
  const setAll = (choice: ConflictChoice) => setChoices(Object.fromEntries(conflicts.map((c) => [conflictKey(c), choice])));

  return (
    <Dialog
      open={open}
      onClose={onClose}
      title={many ? `${conflicts.length} cells were changed by someone else` : 'This cell was changed by someone else'}
      width="w-[40rem]"
      footer={
        many ? (
          <>
            <Button onClick={onClose}>Decide later</Button>
            <Button variant="primary" onClick={() => settle(choiceOf)}>
              Apply these choices
            </Button>
          </>
        ) : (
          <>
            <Button onClick={onClose}>Decide later</Button>
            <Button onClick={() => settle('theirs')}>Take theirs</Button>
            <Button variant="primary" onClick={() => settle('mine')}>
              Keep mine
            </Button>
          </>
        )
      }
    >
      <p className="mb-2.5">
        A colleague saved {many ? 'these cells' : 'this cell'} after you started editing, so your {many ? 'inputs were' : 'input was'} not saved. Choose what stays.
        Nothing is lost: their input remains in the history, and an input of yours you do not keep is set aside for you to copy.
      </p>
      {many && (
        <div className="mb-1.5 flex items-center gap-2 text-caption">
          <span className="text-ink-3">Choose for all:</span>
          <Button variant="ghost" onClick={() => setAll('mine')}>
            Mine
          </Button>
          <Button variant="ghost" onClick={() => setAll('theirs')}>
            Theirs
          </Button>
        </div>
      )}
      <ul aria-label="Conflicting cells" className="flex max-h-[20rem] flex-col divide-y divide-line overflow-y-auto rounded-ctl border border-line">
        {conflicts.map((c) => {
          const address = cellAddress(sheetName(c.sheetId), c.row, c.col);
          const mine = latest.get(conflictKey(c)) ?? c.mine;
          return (
            <li key={conflictKey(c)} aria-label={`Conflict in ${address}`} className="flex items-end gap-3 px-2.5 py-2">
              <span className="w-28 shrink-0 pb-1 font-mono text-caption font-semibold text-ink">{address}</span>
              <Value label={`Theirs (saved in revision #${c.revision})`} input={c.theirs} tone="theirs" />
              <Value label="Mine (not saved)" input={mine} tone="mine" />
              {many && (
                <fieldset className="flex shrink-0 gap-2 pb-1 text-caption">
                  <legend className="sr-only">Keep for {address}</legend>
                  {(['theirs', 'mine'] as const).map((choice) => (
                    <label key={choice} className="flex items-center gap-1">
                      <input type="radio" name={conflictKey(c)} checked={choiceOf(c) === choice} onChange={() => setChoices((all) => ({ ...all, [conflictKey(c)]: choice }))} />
                      {choice === 'mine' ? 'Mine' : 'Theirs'}
                    </label>
                  ))}
                </fieldset>
              )}
            </li>
          );
        })}
      </ul>
    </Dialog>
  );
}
