// The workbook as of one revision, read-only: tabs, column letters, row numbers and the values as
// they were computed from that revision's inputs. A plain table, deliberately not the editing grid.
import { useMemo, useState } from 'react';
import type { RevisionSnapshot } from '@shared/team.js';
import { Notice } from '../../components/ui/Notice.js';
import { columnName } from '@shared/a1.js';
import { snapshotSheets } from './snapshotValues.js';

export function RevisionSnapshotView({ snapshot }: { snapshot: RevisionSnapshot }) {
  const sheets = useMemo(() => snapshotSheets(snapshot), [snapshot]);
  const [sheetId, setSheetId] = useState<string | null>(null);
  const sheet = sheets.find((s) => s.id === sheetId) ?? sheets[0];
  if (!sheet) return <Notice>This revision has no sheets.</Notice>;
  const cols = sheet.cells[0]?.length ?? 0;
  const cut = sheet.usedRows > sheet.cells.length || sheet.usedCols > cols;
  return (
    <div className="flex min-h-0 flex-1 flex-col">
      <div role="tablist" aria-label="Sheets as of this revision" className="flex gap-0.5 border-b border-line">
        {sheets.map((s) => (
          <button
            key={s.id}
            role="tab"
            type="button"
            aria-selected={s.id === sheet.id}
            onClick={() => setSheetId(s.id)}
            className={`rounded-t-ctl px-2.5 py-1 text-ui ${s.id === sheet.id ? 'bg-surface font-medium text-ink shadow-[inset_0_-2px_0_var(--color-accent)]' : 'text-ink-3 hover:text-ink'}`}
          >
            {s.name}
          </button>
        ))}
      </div>
      {sheet.cells.length === 0 ? (
        <p className="px-2 py-3 text-ink-3">This sheet was empty.</p>
      ) : (
        <div className="min-h-0 flex-1 overflow-auto">
          <table aria-label={`${sheet.name} as of this revision (read-only)`} className="border-collapse font-mono text-caption">
            <thead>
              <tr>
                <th className="sticky top-0 left-0 z-20 w-10 border border-line bg-sunken" />
                {Array.from({ length: cols }, (_, c) => (
                  <th key={c} scope="col" className="sticky top-0 z-10 min-w-20 border border-line bg-sunken px-1 font-sans font-medium text-ink-3">
                    {columnName(c)}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {sheet.cells.map((row, r) => (
                <tr key={r}>
                  <th scope="row" className="sticky left-0 z-10 border border-line bg-sunken px-1 text-right font-sans font-medium text-ink-3">
                    {r + 1}
                  </th>
                  {row.map((v, c) => (
                    <td
                      key={c}
                      title={v?.kind === 'error' ? `${v.errorCode}: ${v.errorMessage}` : v?.input || undefined}
                      className={`max-w-48 truncate border border-line px-1.5 py-0.5 ${v?.kind === 'number' ? 'text-right' : ''} ${v?.kind === 'error' ? 'text-danger' : 'text-ink'}`}
                    >
                      {v?.display}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {cut && (
        <p className="border-t border-line px-2 py-1 text-caption text-ink-3">
          Showing the first {sheet.cells.length} rows and {cols} columns of {sheet.usedRows} × {sheet.usedCols}. Restore the revision or export to see everything.
        </p>
      )}
    </div>
  );
}
