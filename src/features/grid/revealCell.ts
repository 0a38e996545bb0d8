import { defaultColumnWidthPx } from '../../core/workbook/model/displaySettings.js';

/**
 * After a jump the grid scrolls the cell into view but lets the sticky row numbers cover the left of
 * it (column A half hidden): once it has scrolled, scroll back so the cell's left edge clears them.
 */
export function revealBesideRowNumbers(col: number, widths: Record<number, number>) {
  let left = 0;
  for (let c = 0; c < col; c++) left += widths[c] ?? defaultColumnWidthPx;
  const fix = () => {
    const scroller = document.querySelector<HTMLElement>('[data-testid="sheet-grid"] .dsg-container');
    if (scroller && scroller.scrollLeft > left) scroller.scrollLeft = left;
  };
  requestAnimationFrame(() => requestAnimationFrame(fix));
}
