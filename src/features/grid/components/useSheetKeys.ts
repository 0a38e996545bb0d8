// Keys and clipboard the grid library does not handle the desktop-spreadsheet way: Enter moves
// down (Shift+Enter up), Home/End, Ctrl+Home/End, Ctrl+Arrow to the data's edge, PageUp/PageDown
// (Shift extends the selection), a double-click on the fill handle fills down beside the data,
// Ctrl+Z / Ctrl+Y, Ctrl+D / Ctrl+R fill, Delete clears, and copy/cut/paste as tab-separated text.
// Listens on window in the capture phase, before the library's document listeners, and stops what
// it handles. Panels outside the grid mark themselves with data-grid-shield and are left alone.
import { useEffect, useRef, type RefObject } from 'react';
import type { DataSheetGridRef } from 'react-datasheet-grid';
import { dataEdge, fillDownEnd } from '../dataEdge.js';
import { noteTypingIntoCell } from './editorOpening.js';
import type { ViewCell } from './SheetGrid.js';

export interface SheetKeyHandlers {
  gridRef: RefObject<DataSheetGridRef | null>;
  isEditing: () => boolean;
  /** Number of view rows and columns. */
  extent: () => { rows: number; cols: number };
  /** The last used cell (view coordinates), and the last used column of a view row. */
  lastUsed: () => ViewCell;
  lastUsedColInRow: (viewRow: number) => number;
  /** Whether a cell (view coordinates) shows anything: Ctrl+Arrow and the fill handle look for data edges. */
  isFilled: (viewRow: number, col: number) => boolean;
  /** The frozen header row (row 1, shown under the column letters): the column in focus there, or null. */
  frozenCol: () => number | null;
  hasFrozenRow: () => boolean;
  /** Focus a cell of the frozen row (null: back into the grid, at its first row). */
  pickFrozen: (col: number | null) => void;
  /** Edit the frozen cell in focus in the formula bar: a typed character replaces, else the caret goes to the end. */
  editInBar: (typed?: string) => void;
  pageRows: () => number;
  /** Why the active cell may not be changed by me, or null; typing there is refused with it. */
  readOnlyHere?: () => string | null;
  /** Told once per keystroke refused on a read-only cell, with the reason. */
  onRefusedTyping?: (reason: string) => void;
  undo: () => void;
  redo: () => void;
  fillDown: () => void;
  fillRight: () => void;
  clear: () => void;
  copy: (cut: boolean) => string | null;
  /** Clipboard text, or a table read from clipboard HTML when there was no text. */
  paste: (text: string, table?: string[][]) => void;
}

const isEditable = (t: EventTarget | null) => t instanceof HTMLElement && !!t.closest('input, textarea, select, [contenteditable="true"]');
const isShielded = (t: EventTarget | null) => t instanceof HTMLElement && !!t.closest('[data-grid-shield]');

/**
 * A clipboard event in a panel beside the grid belongs to the panel only when the user selected text
 * there: a shift-click on the grid leaves the page's (empty) text selection wherever it happens to
 * land, often in the side panel, and Ctrl+C must still copy the grid's cells.
 */
const leftToPanel = (t: EventTarget | null) => isShielded(t) && String(window.getSelection() ?? '') !== '';

/** Reads the first table of clipboard HTML as rows of cell text (when no plain text was given). */
function htmlTable(html: string): string[][] | null {
  const table = new DOMParser().parseFromString(html, 'text/html').querySelector('table');
  if (!table) return null;
  return [...table.rows].map((r) => [...r.cells].map((c) => c.textContent ?? ''));
}

/** Keys on a cell of the frozen header row: arrows move, typing, F2 and Enter edit it in the formula bar. */
function frozenKey(e: KeyboardEvent, x: SheetKeyHandlers, col: number) {
  const stop = () => {
    e.preventDefault();
    e.stopPropagation();
  };
  const mod = e.ctrlKey || e.metaKey;
  if (e.key === 'ArrowDown' || (e.key === 'Enter' && e.shiftKey)) {
    stop();
    x.pickFrozen(null);
  } else if (e.key === 'ArrowLeft' || e.key === 'ArrowRight') {
    stop();
    x.pickFrozen(Math.max(0, Math.min(x.extent().cols - 1, col + (e.key === 'ArrowLeft' ? -1 : 1))));
  } else if (e.key === 'F2' || (e.key === 'Enter' && !mod)) {
    stop();
    x.editInBar();
  } else if (e.key.length === 1 && !mod && !e.altKey) {
    stop();
    x.editInBar(e.key);
  } else if (e.key === 'Delete' || e.key === 'Backspace') {
    stop();
    x.clear();
  }
}

export function useSheetKeys(h: SheetKeyHandlers) {
  const handlers = useRef(h);
  handlers.current = h;

  useEffect(() => {
    // Tab, Tab, Enter returns to the column where the row of entries began (desktop convention).
    let tabAnchorCol: number | null = null;
    const keydown = (e: KeyboardEvent) => {
      const x = handlers.current;
      const grid = x.gridRef.current;
      const active = grid?.activeCell;
      if (grid && !active && x.frozenCol() !== null && !e.defaultPrevented && !e.isComposing && !isShielded(e.target) && !isEditable(e.target)) {
        frozenKey(e, x, x.frozenCol()!);
        return;
      }
      if (!grid || !active || e.defaultPrevented || e.isComposing || isShielded(e.target)) return;
      if (e.target instanceof HTMLElement && (e.target.closest('dialog') || (isEditable(e.target) && !e.target.classList.contains('orb-cell-input')))) return;
      // While the function list is open, its keys (arrows, Tab, Enter, Esc) belong to it.
      if (document.querySelector('[role="listbox"][aria-label="Functions"]')) return;
      if (e.key === 'Tab' && !e.shiftKey) tabAnchorCol ??= active.col;
      else if (e.key === 'Enter' && !e.shiftKey && !e.ctrlKey && !e.metaKey && !e.altKey && tabAnchorCol !== null) {
        const col = tabAnchorCol;
        tabAnchorCol = null;
        e.preventDefault();
        e.stopPropagation();
        grid.setActiveCell({ row: Math.min(x.extent().rows - 1, active.row + 1), col }); // commits an edit in progress
        return;
      } else if (e.key !== 'Shift' && e.key !== 'Tab' && !/^[\p{L}\p{N}\p{P}\p{S} ]$/u.test(e.key) && e.key !== 'Backspace') tabAnchorCol = null;
      const stop = () => {
        e.preventDefault();
        e.stopPropagation();
      };
      const mod = e.ctrlKey || e.metaKey;
      const { rows, cols } = x.extent();
      const clampRow = (r: number) => Math.max(0, Math.min(rows - 1, r));
      if (!x.isEditing() && e.key.length === 1 && !mod && !e.altKey) {
        const refusal = x.readOnlyHere?.();
        if (refusal) {
          stop();
          x.onRefusedTyping?.(refusal);
          return;
        }
        noteTypingIntoCell();
      }
      if (x.isEditing()) {
        if (e.key === 'Enter' && e.shiftKey && !mod) {
          stop();
          grid.setActiveCell({ row: clampRow(active.row - 1), col: active.col }); // commits the edit
        }
        return;
      }
      const go = (target: ViewCell) => {
        stop();
        const cell = { row: clampRow(target.row), col: Math.max(0, Math.min(cols - 1, target.col)) };
        if (e.shiftKey) grid.setSelection({ min: { row: active.row, col: active.col }, max: cell });
        else grid.setActiveCell(cell);
      };
      const arrow = ({ ArrowUp: 'up', ArrowDown: 'down', ArrowLeft: 'left', ArrowRight: 'right' } as const)[e.key as 'ArrowUp'];
      if (arrow && mod && !e.altKey) {
        // From the active cell, or with Shift from the selection's far corner, to the data's edge.
        const sel = grid.selection;
        const far = e.shiftKey && sel ? { row: sel.min.row === active.row ? sel.max.row : sel.min.row, col: sel.min.col === active.col ? sel.max.col : sel.min.col } : active;
        return go(dataEdge(far, arrow, x.isFilled, x.extent()));
      }
      switch (e.key) {
        case 'ArrowUp':
          // From the first row below a frozen header, up into the header row (row 1).
          if (active.row !== 0 || mod || e.shiftKey || e.altKey || !x.hasFrozenRow()) return;
          stop();
          x.pickFrozen(active.col);
          return;
        case 'Enter':
          if (mod || e.altKey) return;
          stop();
          grid.setActiveCell({ row: clampRow(active.row + (e.shiftKey ? -1 : 1)), col: active.col });
          return;
        case 'Home':
          return go(mod ? { row: 0, col: 0 } : { row: active.row, col: 0 });
        case 'End':
          return go(mod ? x.lastUsed() : { row: active.row, col: x.lastUsedColInRow(active.row) });
        case 'PageDown':
          return go({ row: active.row + x.pageRows(), col: active.col });
        case 'PageUp':
          return go({ row: active.row - x.pageRows(), col: active.col });
        case 'Delete':
        case 'Backspace':
          stop();
          x.clear();
          return;
      }
      if (!mod || e.altKey) return;
      const key = e.key.toLowerCase();
      if (key === 'z') {
        stop();
        if (e.shiftKey) x.redo();
        else x.undo();
      } else if (key === 'y') {
        stop();
        x.redo();
      } else if (key === 'd') {
        stop();
        x.fillDown();
      } else if (key === 'r') {
        stop();
        x.fillRight();
      }
    };

    const copyOrCut = (cut: boolean) => (e: ClipboardEvent) => {
      // Inputs (the cell editor, the formula bar) copy their own text; the grid must not react.
      e.stopPropagation();
      if (isEditable(e.target) || leftToPanel(e.target) || !handlers.current.gridRef.current?.activeCell) return;
      const text = handlers.current.copy(cut);
      if (text === null) return;
      e.clipboardData?.setData('text/plain', text);
      e.preventDefault();
    };
    const copy = copyOrCut(false);
    const cut = copyOrCut(true);
    const paste = (e: ClipboardEvent) => {
      e.stopPropagation();
      if (isEditable(e.target) || leftToPanel(e.target) || !handlers.current.gridRef.current?.activeCell) return;
      e.preventDefault();
      const plain = e.clipboardData?.getData('text/plain') ?? '';
      if (plain) return handlers.current.paste(plain);
      const table = htmlTable(e.clipboardData?.getData('text/html') ?? '');
      if (table) handlers.current.paste('', table);
    };

    const mousedown = (e: MouseEvent) => {
      tabAnchorCol = null;
      // A single click on the cell that is already active selects it, as elsewhere; only a
      // double-click (or F2, Enter, typing) starts editing. The grid library would edit on any click.
      const t = e.target;
      if (e.button !== 0 || e.detail > 1 || e.shiftKey || e.ctrlKey || e.metaKey || handlers.current.isEditing()) return;
      if (t instanceof HTMLElement && t.closest('.dsg-cell')?.querySelector('.orb-cell[aria-selected="true"]')) {
        e.stopPropagation();
        // Still a click on a cell: a block selected around it shrinks to that one cell.
        const grid = handlers.current.gridRef.current;
        if (grid?.activeCell && grid.selection && (grid.selection.min.row !== grid.selection.max.row || grid.selection.min.col !== grid.selection.max.col)) {
          grid.setSelection({ min: grid.activeCell, max: grid.activeCell });
        }
      }
    };
    // Focus moving into a field outside the grid (a dialog, a panel) takes the keyboard from the
    // grid, so the grid library stops reading keys typed there.
    const focusin = (e: FocusEvent) => {
      const t = e.target;
      if (isEditable(t) && !isShielded(t) && !(t as HTMLElement).classList.contains('orb-cell-input')) handlers.current.gridRef.current?.setActiveCell(null);
    };
    // Double-clicking the fill handle fills the selection down to the end of the neighbouring
    // column's data (common practice).
    const dblclick = (e: MouseEvent) => {
      const x = handlers.current;
      const grid = x.gridRef.current;
      if (!(e.target instanceof HTMLElement) || !e.target.classList.contains('dsg-expand-rows-indicator') || !grid?.activeCell) return;
      e.stopPropagation();
      e.preventDefault();
      const sel = grid.selection ?? { min: grid.activeCell, max: grid.activeCell };
      const end = fillDownEnd(sel.min.row, sel.min.col, sel.max.col, x.isFilled, x.extent());
      if (end === null || end <= sel.max.row) return;
      grid.setSelection({ min: { row: sel.min.row, col: sel.min.col }, max: { row: end, col: sel.max.col } });
      // The grid applies a selection on its next render; fill once it has.
      requestAnimationFrame(() => x.fillDown());
    };
    window.addEventListener('dblclick', dblclick, true);
    window.addEventListener('focusin', focusin, true);
    window.addEventListener('mousedown', mousedown, true);
    window.addEventListener('keydown', keydown, true);
    window.addEventListener('copy', copy, true);
    window.addEventListener('cut', cut, true);
    window.addEventListener('paste', paste, true);
    return () => {
      window.removeEventListener('mousedown', mousedown, true);
      window.removeEventListener('focusin', focusin, true);
      window.removeEventListener('dblclick', dblclick, true);
      window.removeEventListener('keydown', keydown, true);
      window.removeEventListener('copy', copy, true);
      window.removeEventListener('cut', cut, true);
      window.removeEventListener('paste', paste, true);
    };
  }, []);
}
