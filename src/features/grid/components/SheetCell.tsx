// One grid cell. Idle cells are a plain div with the computed value and no hooks, so scrolling a
// long sheet stays cheap; the active cell being edited mounts an input with the typed text. Memoised
// on its own props, so an edit re-renders only the cells whose view changed (the model replaces only
// the rows it touched). The edit is committed when the editor closes, like the grid library's text
// column does on blur.
import { memo, useEffect, useLayoutEffect, useRef, useState } from 'react';
import { closeBrackets } from '@functions/formulaShape.js';
import type { CellProps } from 'react-datasheet-grid';
import type { CellView } from '../../../core/workbook/model/cellView.js';
import { openedByTyping } from './editorOpening.js';
import { FunctionSuggestions, useFunctionSuggestions } from './FunctionSuggestions.js';
import { ArgumentHint } from './ArgumentHint.js';
import { arrowTarget, canPoint, followDrag, placeOf, withReference, type GridPlace, type Pointed } from './pointing.js';

/** What every cell of a column shares; kept stable so cells do not re-render for nothing. */
export interface CellColumnData {
  col: number;
  /** Tells the formula bar what is being typed in a cell. */
  onEditText: (text: string | null) => void;
  /** The A1 name of a cell in view coordinates (the shown row may be another sheet row). */
  refFor: (viewRow: number, col: number) => string;
  /** How many view rows and columns there are (pointing stops at the edges). */
  extent: () => { rows: number; cols: number };
  /** Shows which cell a formula being typed points at (null: none). */
  onPoint: (cell: { row: number; col: number } | null) => void;
}

type SheetCellProps = CellProps<CellView | null | undefined, CellColumnData>;

function cellClass(v: CellView | null | undefined, disabled: boolean): string {
  if (!v) return disabled ? 'orb-cell orb-cell-locked' : 'orb-cell';
  const parts = ['orb-cell', `orb-cell-${v.kind}`];
  if (v.spilled) parts.push('orb-cell-spilled');
  if (v.readOnlyReason) parts.push('orb-cell-locked');
  return parts.join(' ');
}

function CellEditor({ rowData, setRowData, columnData, rowIndex, columnIndex }: SheetCellProps) {
  const view = rowData ?? null;
  const input = useRef<HTMLInputElement>(null);
  const state = useRef({ escaped: false, changed: false, value: view?.input ?? '' });
  const [text, setText] = useState(view?.input ?? '');
  const [caret, setCaret] = useState((view?.input ?? '').length);
  const pointed = useRef<Pointed | null>(null);
  const suggestions = useFunctionSuggestions(text, input);
  const close = useRef(() => {});
  close.current = () => {
    // Brackets left open are closed on commit: =MOCONFIG(A2 is stored as =MOCONFIG(A2).
    if (state.current.changed && !state.current.escaped) setRowData({ ...(view ?? {}), input: closeBrackets(state.current.value) } as CellView);
    columnData.onEditText(null);
    columnData.onPoint(null);
  };

  useLayoutEffect(() => {
    // Focus at once, before the key that opened the editor is delivered: a typed character replaces
    // the text; F2, Enter or a double-click leave the text and put the caret at its end.
    const el = input.current!;
    el.value = state.current.value;
    el.focus();
    if (openedByTyping()) el.select();
    else el.setSelectionRange(el.value.length, el.value.length);
    return () => close.current();
  }, []);

  const update = (t: string, keepPointed = false) => {
    state.current.changed = true;
    state.current.value = t;
    setText(t);
    columnData.onEditText(t);
    if (!keepPointed && pointed.current) {
      pointed.current = null;
      columnData.onPoint(null);
    }
  };
  const applySuggestion = (t: string) => {
    if (input.current) input.current.value = t;
    update(t);
  };

  const pointable = () => input.current !== null && canPoint(input.current, pointed.current);
  /** Inserts (or replaces the last pointed) reference to `cell`; with `extend`, a range from the anchor. */
  const pointAt = (cell: GridPlace, extend = false) => {
    const el = input.current!;
    const made = withReference(el, pointed.current, cell, extend, columnData.refFor);
    el.value = made.text;
    el.setSelectionRange(made.pointed.end, made.pointed.end);
    pointed.current = made.pointed;
    update(made.text, true);
    setCaret(made.pointed.end);
    columnData.onPoint(cell);
  };

  // A click on another cell while pointable inserts its reference instead of leaving the editor.
  // Window, capture phase: before the grid library's document listener would commit and move.
  useEffect(() => {
    const mousedown = (e: MouseEvent) => {
      const cell = e.button === 0 ? placeOf(e.target) : null;
      if (!cell || !pointable()) return;
      if (cell.row === rowIndex && cell.col === columnIndex && !pointed.current) return;
      e.preventDefault(); // the caret stays in the editor
      e.stopPropagation();
      pointAt(cell, e.shiftKey);
      followDrag((over) => pointAt(over, true));
    };
    window.addEventListener('mousedown', mousedown, true);
    return () => window.removeEventListener('mousedown', mousedown, true);
  });

  return (
    <>
      <input
        ref={input}
        className="orb-cell-input"
        aria-label="Cell input"
        spellCheck={false}
        tabIndex={-1}
        onChange={(e) => {
          update(e.target.value);
          setCaret(e.target.selectionStart ?? e.target.value.length);
        }}
        onSelect={(e) => setCaret(e.currentTarget.selectionStart ?? 0)}
        onKeyDown={(e) => {
          if (suggestions.handleKey(e, applySuggestion)) return;
          if (e.key === 'Escape') state.current.escaped = true;
          // Arrows point at cells while a formula waits for a reference (the grid does not move).
          const target = e.ctrlKey || e.metaKey || e.altKey ? null : arrowTarget(e.key, input.current!, pointed.current, { row: rowIndex, col: columnIndex }, columnData.extent());
          if (target && pointable()) {
            e.preventDefault();
            e.stopPropagation();
            pointAt(target, e.shiftKey);
          }
        }}
      />
      <FunctionSuggestions state={suggestions} anchor={input} apply={applySuggestion} />
      <ArgumentHint text={text} caret={caret} anchor={input} hidden={suggestions.items.length > 0} />
    </>
  );
}

function SheetCellImpl(props: SheetCellProps) {
  if (props.focus) return <CellEditor {...props} />;
  const view = props.rowData ?? null;
  const title = view?.kind === 'pending' ? 'Computing on the server; the value appears here when it is ready' : view?.kind === 'error' ? `${view.errorCode}: ${view.errorMessage}` : view?.spilled ? 'Filled by an array formula (read-only)' : view?.kind === 'number' ? String(view.value) : undefined;
  // The text sits in its own box so that what does not fit ends in an ellipsis (a flex container
  // would cut it off with no sign); a number's full value is in the tooltip.
  return (
    <div className={cellClass(view, props.disabled)} title={title} data-cell-kind={view?.kind} data-view-row={props.rowIndex} data-col={props.columnIndex} aria-selected={props.active || undefined}>
      {view?.display ? <span className="orb-cell-text">{view.display}</span> : null}
    </div>
  );
}

export const SheetCell = memo(SheetCellImpl, (a, b) => a.rowData === b.rowData && a.rowIndex === b.rowIndex && a.focus === b.focus && a.active === b.active && a.disabled === b.disabled && a.columnData === b.columnData);
