// The first screenful of a large workbook while its full engine is still being built: the same
// look as the grid, read-only, with a note that the rest is on its way.
import { columnName } from '@shared/a1.js';
import { defaultColumnWidthPx, readDisplaySettings } from '../../../core/workbook/model/displaySettings.js';
import type { SheetSettings } from '@shared/workbooks.js';
import type { SheetPreview } from '../../../core/workbook/model/windowPreview.js';

const cellClass = (kind: string | undefined) => `orb-cell ${kind ? `orb-cell-${kind}` : ''}`;

/** The row header's width as drawn below (w-[52px]). */
const rowHeaderPx = 52;

/** The window's size, and a row's height as drawn below (h-6: 1.5 rem); generous where there is no window. */
function fittingArea(): { width: number; height: number; rowPx: number } {
  if (typeof window === 'undefined') return { width: 4096, height: 2160, rowPx: 16 };
  const rem = parseFloat(getComputedStyle(document.documentElement).fontSize) || 16;
  return { width: window.innerWidth, height: window.innerHeight, rowPx: 1.5 * rem };
}

export function PreviewGrid({ title, preview, settings }: { title: string; preview: SheetPreview; settings: SheetSettings | undefined }) {
  const widths = readDisplaySettings(settings).columnWidths;
  // Only what fits the window is drawn: its first layout came while the rest of the workbook was
  // still arriving, and twice the cells it shows took twice as long to lay out (a 180 ms task).
  const fit = fittingArea();
  const cols: { c: number; w: number }[] = [];
  for (let c = 0, x = rowHeaderPx; c < Math.min(preview.colCount, 30) && x < fit.width; c++) {
    const w = widths[c] ?? defaultColumnWidthPx;
    cols.push({ c, w });
    x += w;
  }
  const rows = preview.rows.slice(0, Math.ceil(fit.height / fit.rowPx));
  const border = 'border-r border-b border-line';
  return (
    <div className="flex h-full min-h-0 flex-col bg-canvas">
      <div className="flex h-9 shrink-0 items-center gap-3 border-b border-line bg-surface px-3">
        <h1 className="truncate text-ui font-semibold">{title}</h1>
        <span className="ml-auto text-caption text-ink-2" role="status">
          {preview.stored ? 'Opening the workbook…' : 'Computing the whole workbook…'}
        </span>
      </div>
      <div className="h-8 shrink-0 border-b border-line bg-raised" />
      <div className="h-8 shrink-0 border-b border-line bg-surface" />
      <div className="orb-grid min-h-0 flex-1 overflow-hidden bg-surface" data-testid="sheet-grid" data-preview="true" aria-busy="true">
        <div className="flex h-6">
          <div className={`w-[52px] shrink-0 bg-raised ${border}`} />
          {cols.map(({ c, w }) => (
            <div key={c} style={{ width: w }} className={`flex shrink-0 items-center justify-center bg-raised font-sans text-caption font-medium text-ink-3 ${border}`}>
              {columnName(c)}
            </div>
          ))}
        </div>
        {rows.map((row, r) => (
          <div key={r} className="flex h-6">
            <div className={`flex w-[52px] shrink-0 items-center justify-end bg-raised pr-1.5 text-[11px] text-ink-3 ${border}`}>{r + 1}</div>
            {cols.map(({ c, w }) => (
              <div key={c} style={{ width: w }} className={`shrink-0 ${border}`}>
                <div className={cellClass(row[c]?.kind)}>{row[c]?.display}</div>
              </div>
            ))}
          </div>
        ))}
      </div>
    </div>
  );
}
