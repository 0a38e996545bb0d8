// The first screenful of a workbook, read-only, drawn as plain DOM from a preview (stored values, or a
// window of a large workbook while its engine is built): the same look as the grid, with a note that
// the rest is on its way. Plain DOM, not React, so the page's first script can draw it as soon as the
// first rows arrive (src/app/earlyGlance.ts), before React and the workbook screen's code are in; the
// workbook screen draws the same through PreviewGrid.tsx. Text goes in as text, never as markup.
import { columnName } from '@shared/a1.js';
import type { SheetSettings } from '@shared/workbooks.js';
import { defaultColumnWidthPx, readDisplaySettings } from '../../core/workbook/model/displaySettings.js';
import type { SheetPreview } from '../../core/workbook/model/windowPreview.js';
import './cells.css';

/** The classes of the element a preview is drawn into (it fills the page below the app's bar). */
export const previewFrameClass = 'flex h-full min-h-0 flex-col bg-canvas';

/** The row header's width as drawn below (w-[52px]). */
const rowHeaderPx = 52;

/** Columns drawn at most. */
const maxCols = 30;

/** The window's size, and a row's height as drawn below (h-6: 1.5 rem). */
function fittingArea(): { width: number; height: number; rowPx: number } {
  const rem = parseFloat(getComputedStyle(document.documentElement).fontSize) || 16;
  return { width: window.innerWidth, height: window.innerHeight, rowPx: 1.5 * rem };
}

/** An element with these classes and, if given, this text (as text, never as markup). */
export function el(tag: string, className: string, text?: string): HTMLElement {
  const e = document.createElement(tag);
  e.className = className;
  if (text !== undefined) e.textContent = text;
  return e;
}

export interface PreviewFrame {
  title: string;
  preview: SheetPreview;
  settings: SheetSettings | undefined;
}

/** Draws the preview into `frame` (replacing what it held); only what fits the window is drawn. */
export function drawPreview(frame: HTMLElement, { title, preview, settings }: PreviewFrame): void {
  const widths = readDisplaySettings(settings).columnWidths;
  // Only what fits the window is drawn: its first layout came while the rest of the workbook was
  // still arriving, and twice the cells it shows took twice as long to lay out (a 180 ms task).
  const fit = fittingArea();
  const cols: { c: number; w: number }[] = [];
  for (let c = 0, x = rowHeaderPx; c < Math.min(preview.colCount, maxCols) && x < fit.width; c++) {
    const w = widths[c] ?? defaultColumnWidthPx;
    cols.push({ c, w });
    x += w;
  }
  const rows = preview.rows.slice(0, Math.ceil(fit.height / fit.rowPx));
  const border = 'border-r border-b border-line';

  const bar = el('div', 'flex h-9 shrink-0 items-center gap-3 border-b border-line bg-surface px-3');
  bar.append(el('h1', 'truncate text-ui font-semibold', title));
  const status = el('span', 'ml-auto text-caption text-ink-2', preview.stored ? 'Opening the workbook…' : 'Computing the whole workbook…');
  status.setAttribute('role', 'status');
  bar.append(status);

  const grid = el('div', 'orb-grid min-h-0 flex-1 overflow-hidden bg-surface');
  grid.dataset.testid = 'sheet-grid';
  grid.dataset.preview = 'true';
  grid.setAttribute('aria-busy', 'true');
  const header = el('div', 'flex h-6');
  header.append(el('div', `w-[52px] shrink-0 bg-raised ${border}`));
  for (const { c, w } of cols) {
    const h = el('div', `flex shrink-0 items-center justify-center bg-raised font-sans text-caption font-medium text-ink-3 ${border}`, columnName(c));
    h.style.width = `${w}px`;
    header.append(h);
  }
  grid.append(header);
  rows.forEach((row, r) => {
    const line = el('div', 'flex h-6');
    line.append(el('div', `flex w-[52px] shrink-0 items-center justify-end bg-raised pr-1.5 text-[11px] text-ink-3 ${border}`, String(r + 1)));
    for (const { c, w } of cols) {
      const box = el('div', `shrink-0 ${border}`);
      box.style.width = `${w}px`;
      const view = row[c];
      box.append(el('div', `orb-cell ${view?.kind ? `orb-cell-${view.kind}` : ''}`, view?.display ?? ''));
      line.append(box);
    }
    grid.append(line);
  });

  frame.replaceChildren(bar, el('div', 'h-8 shrink-0 border-b border-line bg-raised'), el('div', 'h-8 shrink-0 border-b border-line bg-surface'), grid);
}
