// What an import took and what it could not: counts, then each skipped cell with its reason.
import type { ImportSummary } from '@shared/io.js';
import { plural } from '@shared/plural.js';

const LISTED = 20;

export function ImportSummaryView({ summary }: { summary: ImportSummary }) {
  const { skipped, notes } = summary;
  return (
    <div className="flex flex-col gap-2" data-testid="import-summary">
      <p className="text-ink">
        Imported {plural(summary.sheets, 'sheet')}, {plural(summary.cells, 'cell')} ({plural(summary.formulas, 'formula')}).
        {skipped.length === 0 ? ' Every cell was taken.' : ''}
      </p>
      {skipped.length > 0 && (
        <div>
          <p className="font-medium text-caution">{plural(skipped.length, 'cell')} could not be taken:</p>
          <ul className="mt-1 max-h-40 overflow-y-auto rounded-ctl border border-line bg-raised px-2 py-1 font-mono text-caption">
            {skipped.slice(0, LISTED).map((s, i) => (
              <li key={i}>
                {s.sheet}!{s.address} — {s.reason}
              </li>
            ))}
            {skipped.length > LISTED && <li>… and {skipped.length - LISTED} more</li>}
          </ul>
        </div>
      )}
      {notes.length > 0 && (
        <ul className="list-disc pl-4 text-caption text-ink-2">
          {notes.map((n, i) => (
            <li key={i}>{n}</li>
          ))}
        </ul>
      )}
      <p className="text-caption text-ink-3">Formulas Orbitab cannot evaluate are kept as typed and show their error in the grid.</p>
    </div>
  );
}
