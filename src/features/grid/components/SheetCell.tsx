// One grid cell. Idle cells are a plain div with the computed value and no hooks, so scrolling a
// long sheet stays cheap; the active cell being edited mounts an input with the typed text. Memoised
// on its own props, so an edit re-renders only the cells whose view changed (the model replaces only
// the rows it touched). The edit is committed when the editor closes, like the grid library's text
// column does on blur.
import { memo, useLayoutEffect, useRef, useState } from 'react';
import type { CellProps } from 'react-datasheet-grid';
import type { CellView } from '../../../core/workbook/model/cellView.js';
import { openedByTyping } from './editorOpening.js';
import { FunctionSuggestions, useFunctionSuggestions } from './FunctionSuggestions.js';

/** What every cell of a column shares; kept stable so cells do not re-render for nothing. */
export interface CellColumnData {
  col: number;
  /** Tells the formula bar what is being typed in a cell. */
  onEditText: (text: string | null) => void;
}

type SheetCellProps = CellProps<CellView | null | undefined, CellColumnData>;

function cellClass(v: CellView | null | undefined, disabled: boolean): string {
  if (!v) return disabled ? 'orb-cell orb-cell-locked' : 'orb-cell';
  const parts = ['orb-cell', `orb-cell-${v.kind}`];
  if (v.spilled) parts.push('orb-cell-spilled');
  if (v.readOnlyReason) parts.push('orb-cell-locked');
  return parts.join(' ');
}

function CellEditor({ rowData, setRowData, columnData }: SheetCellProps) {
  const view = rowData ?? null;
  const input = useRef<HTMLInputElement>(null);
  const state = useRef({ escaped: false, changed: false, value: view?.input ?? '' });
  const [text, setText] = useState(view?.input ?? '');
  const suggestions = useFunctionSuggestions(text, input);
  const close = useRef(() => {});
  close.current = () => {
    if (state.current.changed && !state.current.escaped) setRowData({ ...(view ?? {}), input: state.current.value } as CellView);
    columnData.onEditText(null);
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

  const update = (t: string) => {
    state.current.changed = true;
    state.current.value = t;
    setText(t);
    columnData.onEditText(t);
  };
  const applySuggestion = (t: string) => {
    if (input.current) input.current.value = t;
    update(t);
  };

  return (
    <>
      <input
        ref={input}
        className="orb-cell-input"
        aria-label="Cell input"
        spellCheck={false}
        tabIndex={-1}
        onChange={(e) => update(e.target.value)}
        onKeyDown={(e) => {
          if (suggestions.handleKey(e, applySuggestion)) return;
          if (e.key === 'Escape') state.current.escaped = true;
        }}
      />
      <FunctionSuggestions state={suggestions} anchor={input} apply={applySuggestion} />
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
    <div className={cellClass(view, props.disabled)} title={title} data-cell-kind={view?.kind} aria-selected={props.active || undefined}>
      {view?.display ? <span className="orb-cell-text">{view.display}</span> : null}
    </div>
  );
}

export const SheetCell = memo(SheetCellImpl, (a, b) => a.rowData === b.rowData && a.focus === b.focus && a.active === b.active && a.disabled === b.disabled && a.columnData === b.columnData);
