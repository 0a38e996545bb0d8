// The change log: one line per saved change, newest first, with who and when and the cells it
// changed (before → after). Any entry can bring back one sheet, or the whole workbook, as it was
// right after it; that is saved as a new entry, so nothing in between is lost.
import { useState } from 'react';
import { allows, type WorkbookAction } from '@shared/permissions.js';
import type { RevisionSummary } from '@shared/workbooks.js';
import { Button } from '../../components/ui/Button.js';
import { Dialog } from '../../components/ui/Dialog.js';
import { Notice } from '../../components/ui/Notice.js';
import { sentence } from '../../lib/fieldErrors.js';
import { timeAgo } from '../../lib/relativeTime.js';
import { useRestoreRevision, useRevisions } from './api.js';
import { cellLines, changeCountText, displayRunText, entryHeadline, groupLog, touchedSheets, type SheetNameOf } from './changeLog.js';

const exact = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'medium' });

function Byline({ r }: { r: RevisionSummary }) {
  return (
    <span className="text-caption text-ink-3">
      {r.author?.name ?? 'a former account'} ·{' '}
      <span className="tabular-nums" title={exact.format(new Date(r.createdAt))}>
        {timeAgo(r.createdAt)}
      </span>
    </span>
  );
}

type Target = { n: number; sheetId?: string };

function BringBack({ r, nameOf, current, onAsk }: { r: RevisionSummary; nameOf: SheetNameOf; current: number; onAsk: (t: Target) => void }) {
  if (r.number === current) return <span className="text-caption text-ink-3">the workbook is as this left it</span>;
  const sheets = touchedSheets(r.preview).filter((id) => nameOf(id) !== null);
  return (
    <span className="flex flex-wrap gap-1.5">
      {sheets.slice(0, 3).map((id) => (
        <button key={id} type="button" className="rounded-ctl border border-line px-1.5 text-caption text-ink-2 hover:bg-hover hover:text-ink" onClick={() => onAsk({ n: r.number, sheetId: id })}>
          Bring back “{nameOf(id)}” as after #{r.number}…
        </button>
      ))}
      <button type="button" className="rounded-ctl border border-line px-1.5 text-caption text-ink-2 hover:bg-hover hover:text-ink" onClick={() => onAsk({ n: r.number })}>
        Bring back the whole workbook…
      </button>
    </span>
  );
}

function Entry({ r, nameOf, current, canRestore, onAsk }: { r: RevisionSummary; nameOf: SheetNameOf; current: number; canRestore: boolean; onAsk: (t: Target) => void }) {
  const { lines, more } = cellLines(r.preview, nameOf);
  return (
    <li aria-label={`Change #${r.number}`} className="flex flex-col gap-1 px-3 py-2">
      <div className="flex items-baseline gap-2">
        <span className="font-mono text-caption text-ink-3">#{r.number}</span>
        <span className="font-medium text-ink">{entryHeadline(r, nameOf)}</span>
        <span className="text-caption text-ink-3">· {changeCountText(r.changeCount)}</span>
        <span className="ml-auto">
          <Byline r={r} />
        </span>
      </div>
      {lines.length > 0 && (
        <table className="ml-7 w-[calc(100%-1.75rem)] table-fixed text-caption" aria-label={`Cells changed in #${r.number}`}>
          <colgroup>
            <col className="w-20" />
            <col />
            <col className="w-6" />
            <col />
          </colgroup>
          <tbody>
            {lines.map((l, i) => (
              <tr key={i}>
                <th scope="row" className="pr-3 text-left font-mono font-normal text-ink-3">
                  {l.where}
                </th>
                <td className={`truncate pr-2 font-mono text-ink-3 ${l.before === '(empty)' ? 'italic' : 'line-through decoration-line-strong'}`} title={l.before}>
                  {l.before}
                </td>
                <td className="text-center text-ink-3">→</td>
                <td className={`truncate font-mono ${l.after === '(empty)' ? 'text-ink-3 italic' : 'text-ink'}`} title={l.after}>
                  {l.after}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {more && <p className="ml-7 text-caption text-ink-3">{more}</p>}
      {canRestore && (
        <div className="ml-7">
          <BringBack r={r} nameOf={nameOf} current={current} onAsk={onAsk} />
        </div>
      )}
    </li>
  );
}

export function HistoryDialog({ open, onClose, workbookId, actions, sheetName }: { open: boolean; onClose: () => void; workbookId: string; actions: WorkbookAction[]; sheetName: SheetNameOf }) {
  const list = useRevisions(workbookId, open);
  const [asking, setAsking] = useState<Target | null>(null);
  const restore = useRestoreRevision(workbookId);
  const current = list.data?.revision ?? 0;
  const canRestore = allows(actions, 'restore');
  const ask = (t: Target) => {
    setAsking(t);
    restore.reset();
  };
  const what = asking?.sheetId ? `Sheet “${sheetName(asking.sheetId)}” goes back to how it was right after #${asking.n}; the other sheets stay as they are.` : `Every sheet goes back to how it was right after #${asking?.n}.`;

  return (
    <Dialog open={open} onClose={onClose} title="Change log" width="w-[52rem]" footer={<Button onClick={onClose}>Close</Button>}>
      <div className="flex h-[30rem] flex-col gap-2">
        {asking && (
          <div role="group" aria-label="Confirm bringing back" className="flex items-center gap-2 rounded-ctl border border-caution-line bg-caution-soft px-3 py-2 text-ink">
            <p className="flex-1 text-caption">{what} This is saved as a new entry; later entries stay in the log and can be brought back too.</p>
            <Button onClick={() => setAsking(null)}>Keep as is</Button>
            <Button variant="primary" busy={restore.isPending} onClick={() => restore.mutate(asking, { onSuccess: () => setAsking(null) })}>
              Bring it back
            </Button>
          </div>
        )}
        {restore.isError && <Notice tone="error">{sentence(restore.error.message)}</Notice>}
        {restore.isSuccess && (
          <Notice tone="success">
            Brought back as entry #{restore.data.revision} ({changeCountText(restore.data.changeCount)}).
          </Notice>
        )}
        <div className="min-h-0 flex-1 overflow-y-auto rounded-ctl border border-line">
          {list.isPending ? (
            <p role="status" className="p-2.5 text-ink-3">
              Loading the change log…
            </p>
          ) : list.isError ? (
            <Notice tone="error" className="m-2">
              {sentence(list.error.message)}
            </Notice>
          ) : list.data.revisions.length === 0 ? (
            <p className="p-2.5 text-ink-3">Nothing saved yet.</p>
          ) : (
            <ol aria-label="Changes" className="divide-y divide-line">
              {groupLog(list.data.revisions).map((e) =>
                e.kind === 'one' ? (
                  <Entry key={e.revision.number} r={e.revision} nameOf={sheetName} current={current} canRestore={canRestore} onAsk={ask} />
                ) : (
                  <li key={e.revisions[0].number} aria-label={`Display changes #${e.revisions[e.revisions.length - 1].number}–#${e.revisions[0].number}`} className="flex items-baseline gap-2 bg-sunken px-3 py-1.5">
                    <span className="font-mono text-caption text-ink-3">
                      #{e.revisions.length > 1 ? `${e.revisions[e.revisions.length - 1].number}–${e.revisions[0].number}` : e.revisions[0].number}
                    </span>
                    <span className="text-caption text-ink-2">{displayRunText(e.revisions, sheetName)}</span>
                    <span className="ml-auto">
                      <Byline r={e.revisions[0]} />
                    </span>
                  </li>
                ),
              )}
            </ol>
          )}
        </div>
      </div>
    </Dialog>
  );
}
