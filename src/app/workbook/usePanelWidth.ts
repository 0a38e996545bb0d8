// The side panel's width, snapped so the grid beside it ends on a column boundary: a column cut by
// the panel's edge hides the end of its right-aligned numbers. The panel keeps at least its usual
// width and grows by less than one column; a column wider than the panel may grow by stays cut.
import { useEffect, useState, type RefObject } from 'react';
import { defaultColumnWidthPx } from '../../core/workbook/model/displaySettings.js';

/** Row-number column of the grid (SheetGrid's gutter basis). */
const GUTTER_PX = 52;
const PANEL_REM = 26;

export interface PanelFit {
  /** Width of the row holding the grid and the panel. */
  rowPx: number;
  /** The grid's own vertical scrollbar, which takes room from its columns (0 for overlay scrollbars). */
  scrollbarPx: number;
  gutterPx: number;
  minPanelPx: number;
  /** The most the panel may grow to close a gap. */
  maxPanelPx: number;
  colCount: number;
  widthOf: (col: number) => number;
}

export function snappedPanelWidth(f: PanelFit): number {
  const room = f.rowPx - f.gutterPx - f.scrollbarPx; // the panel's width includes its border
  let used = 0;
  for (let col = 0; col < f.colCount; col++) {
    const w = f.widthOf(col);
    if (used + w > room - f.minPanelPx) break;
    used += w;
  }
  const panel = room - used;
  return panel <= f.maxPanelPx ? panel : f.minPanelPx;
}

export function usePanelWidth(row: RefObject<HTMLElement | null>, open: boolean, colCount: number, widths: Record<number, number>): number | undefined {
  const [size, setSize] = useState<{ rowPx: number; scrollbarPx: number; remPx: number } | null>(null);
  useEffect(() => {
    const el = row.current;
    if (!el || !open) return;
    const measure = () => {
      const scroller = el.querySelector<HTMLElement>('[data-testid="sheet-grid"] .dsg-container');
      const scrollbarPx = scroller ? scroller.offsetWidth - scroller.clientWidth : 0;
      const remPx = parseFloat(getComputedStyle(document.documentElement).fontSize) || 16;
      setSize((s) => (s && s.rowPx === el.clientWidth && s.scrollbarPx === scrollbarPx && s.remPx === remPx ? s : { rowPx: el.clientWidth, scrollbarPx, remPx }));
    };
    measure();
    const ro = new ResizeObserver(measure);
    ro.observe(el);
    return () => ro.disconnect();
  }, [row, open]);
  if (!open || !size) return undefined;
  const minPanelPx = PANEL_REM * size.remPx;
  return snappedPanelWidth({
    rowPx: size.rowPx,
    scrollbarPx: size.scrollbarPx,
    gutterPx: GUTTER_PX,
    minPanelPx,
    maxPanelPx: minPanelPx + 160,
    colCount,
    widthOf: (c) => widths[c] ?? defaultColumnWidthPx,
  });
}
