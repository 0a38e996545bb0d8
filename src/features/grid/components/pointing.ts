// Point mode, one rule for the cell editor and the formula bar: while a formula waits for a
// reference, a click, a drag or an arrow inserts one at the caret (Shift or a drag makes a range from
// where pointing began), and the next one replaces the reference just inserted.
import { acceptsReference } from '@functions/formulaShape.js';

export type GridPlace = { row: number; col: number };

/** The reference just inserted by pointing: where it sits in the text and the cells it names. */
export interface Pointed {
  start: number;
  end: number;
  anchor: GridPlace;
  cell: GridPlace;
}

const ARROWS: Record<string, [number, number]> = { ArrowUp: [-1, 0], ArrowDown: [1, 0], ArrowLeft: [0, -1], ArrowRight: [0, 1] };

/** The reference just pointed at, while the caret still sits right after it. */
function atCaret(el: HTMLInputElement, pointed: Pointed | null): Pointed | null {
  return pointed && pointed.end === (el.selectionStart ?? el.value.length) ? pointed : null;
}

/** The caret sits where a reference may go, or right after one just pointed at. */
export function canPoint(el: HTMLInputElement, pointed: Pointed | null): boolean {
  if (el.selectionStart !== el.selectionEnd) return false;
  return atCaret(el, pointed) !== null || acceptsReference(el.value, el.selectionStart ?? el.value.length);
}

/** The text with a reference to `cell` at the caret (replacing the one just pointed at); with `extend`, a range from its anchor. */
export function withReference(el: HTMLInputElement, pointed: Pointed | null, cell: GridPlace, extend: boolean, refFor: (row: number, col: number) => string): { text: string; pointed: Pointed } {
  const at = el.selectionStart ?? el.value.length;
  const last = atCaret(el, pointed);
  const start = last ? last.start : at;
  const anchor = extend && last ? last.anchor : cell;
  const ref =
    anchor.row === cell.row && anchor.col === cell.col
      ? refFor(cell.row, cell.col)
      : `${refFor(Math.min(anchor.row, cell.row), Math.min(anchor.col, cell.col))}:${refFor(Math.max(anchor.row, cell.row), Math.max(anchor.col, cell.col))}`;
  return { text: el.value.slice(0, start) + ref + el.value.slice(last ? last.end : at), pointed: { start, end: start + ref.length, anchor, cell } };
}

/** The cell an arrow key points at: one step from the cell just pointed at (else from `origin`), kept on the grid; null for other keys. */
export function arrowTarget(key: string, el: HTMLInputElement, pointed: Pointed | null, origin: GridPlace, extent: { rows: number; cols: number }): GridPlace | null {
  const step = ARROWS[key];
  if (!step) return null;
  const from = atCaret(el, pointed)?.cell ?? origin;
  return { row: Math.max(0, Math.min(extent.rows - 1, from.row + step[0])), col: Math.max(0, Math.min(extent.cols - 1, from.col + step[1])) };
}

/** The grid cell under a mouse event's target, if any. */
export function placeOf(target: EventTarget | null): GridPlace | null {
  const el = target instanceof HTMLElement ? target.closest<HTMLElement>('[data-view-row]') : null;
  return el ? { row: Number(el.dataset.viewRow), col: Number(el.dataset.col) } : null;
}

/**
 * While the button that pointed at a cell stays down, dragging over other cells makes the reference
 * a range from the first one (the grid's own drag selection never starts: its mousedown was taken).
 */
export function followDrag(extendTo: (cell: GridPlace) => void) {
  let last = '';
  const move = (e: MouseEvent) => {
    const over = placeOf(e.target);
    if (!over) return;
    e.preventDefault();
    const key = `${over.row}:${over.col}`;
    if (key === last) return;
    last = key;
    extendTo(over);
  };
  const up = () => {
    window.removeEventListener('mousemove', move, true);
    window.removeEventListener('mouseup', up, true);
  };
  window.addEventListener('mousemove', move, true);
  window.addEventListener('mouseup', up, true);
}
