// The formula bar: the address of the cell in focus (type an address to jump), its input (edit it
// here as well as in the cell), and, for an error or a read-only cell, the reason in plain words.
import { useEffect, useImperativeHandle, useRef, useState, type KeyboardEvent, type Ref } from 'react';
import type { CellView } from '../../../core/workbook/model/cellView.js';
import { closeBrackets } from '@functions/formulaShape.js';
import { FunctionSuggestions, useFunctionSuggestions } from './FunctionSuggestions.js';
import { ArgumentHint } from './ArgumentHint.js';
import { arrowTarget, canPoint, followDrag, placeOf, withReference, type GridPlace, type Pointed } from './pointing.js';

export interface FormulaBarProps {
  address: string;
  /** The stored input of the cell in focus. */
  input: string;
  /** What is being typed in the cell itself, mirrored live. */
  liveText: string | null;
  view: CellView | undefined;
  readOnlyReason: string | null;
  disabled: boolean;
  onCommit: (input: string) => void;
  onCancel: () => void;
  onGoTo: (address: string) => boolean;
  /** The A1 name of a grid cell (view row, column): a click on one while a formula waits for a reference inserts it. */
  refFor?: (viewRow: number, col: number) => string;
  /** Where arrow keys start pointing from (the cell in focus, as a view row) and the grid's size. */
  pointFrom?: { viewRow: number; col: number } | null;
  extent?: () => { rows: number; cols: number };
  /** Lets the keyboard open the bar for the cell in focus (the frozen header row is edited here). */
  barRef?: Ref<FormulaBarHandle>;
}

export interface FormulaBarHandle {
  /** Focuses the bar: with a typed character it replaces the input, without one the caret goes to the end. */
  edit(typed?: string): void;
}

export function FormulaBar(p: FormulaBarProps) {
  const [draft, setDraft] = useState<string | null>(null);
  const [addressDraft, setAddressDraft] = useState<string | null>(null);
  const [caret, setCaret] = useState(0);
  const field = useRef<HTMLInputElement>(null);
  const text = draft ?? p.liveText ?? p.input;
  const suggestions = useFunctionSuggestions(draft ?? '', field);
  useEffect(() => setDraft(null), [p.address]);
  const pendingCaret = useRef<string | null>(null);
  useImperativeHandle(p.barRef, () => ({
    edit(typed) {
      const el = field.current;
      if (!el || p.disabled) return;
      pendingCaret.current = typed ?? p.input;
      el.focus();
    },
  }));

  // Point mode in the bar: while the formula waits for a reference, a click on a grid cell or an
  // arrow key inserts one (Shift extends it to a range from where pointing began); the next click or
  // arrow replaces the reference just inserted.
  const pointed = useRef<Pointed | null>(null);
  const refFor = p.refFor;
  const pointAt = (el: HTMLInputElement, cell: GridPlace, extend: boolean) => {
    if (!refFor) return;
    const made = withReference(el, pointed.current, cell, extend, refFor);
    const end = made.pointed.end;
    pointed.current = made.pointed;
    // Set on the field at once as well: a drag or a held arrow may point again before React renders.
    el.value = made.text;
    el.setSelectionRange(end, end);
    setDraft(made.text);
    setCaret(end);
    // Again after React's render, unless keys typed since have moved on: put back then, the caret
    // would jump before them (a ')' typed at once would land inside the reference's bracket).
    requestAnimationFrame(() => {
      if (el.value === made.text) el.setSelectionRange(end, end);
    });
  };
  useEffect(() => {
    if (draft === null || !refFor) return;
    const mousedown = (e: MouseEvent) => {
      const el = field.current;
      const cell = e.button === 0 ? placeOf(e.target) : null;
      if (!el || !cell || document.activeElement !== el || !canPoint(el, pointed.current)) return;
      e.preventDefault();
      e.stopPropagation();
      pointAt(el, cell, e.shiftKey);
      followDrag((over) => pointAt(el, over, true));
    };
    window.addEventListener('mousedown', mousedown, true);
    return () => window.removeEventListener('mousedown', mousedown, true);
  });
  const arrowPoint = (e: KeyboardEvent<HTMLInputElement>): boolean => {
    const el = e.currentTarget;
    if (e.ctrlKey || e.metaKey || e.altKey || draft === null || !p.pointFrom || !p.extent) return false;
    const target = arrowTarget(e.key, el, pointed.current, { row: p.pointFrom.viewRow, col: p.pointFrom.col }, p.extent());
    if (!target || !canPoint(el, pointed.current)) return false;
    e.preventDefault();
    pointAt(el, target, e.shiftKey);
    return true;
  };

  const problem = p.view?.kind === 'error' ? `${p.view.errorCode} ${p.view.errorMessage}` : null;
  return (
    <div data-grid-shield="" onMouseDown={(e) => e.stopPropagation()} onKeyDown={(e) => e.stopPropagation()} className="flex shrink-0 flex-col border-b border-line bg-surface">
      <div className="flex h-8 items-center gap-2 px-2">
        <input
          aria-label="Cell address"
          className="h-6 w-24 rounded-ctl border border-line bg-raised px-1.5 font-mono text-caption text-ink focus:border-accent focus:outline-none"
          value={addressDraft ?? p.address}
          onChange={(e) => setAddressDraft(e.target.value)}
          onFocus={(e) => e.target.select()}
          onBlur={() => setAddressDraft(null)}
          onKeyDown={(e) => {
            const box = e.currentTarget;
            // Leaving the box hands the keyboard back to the grid (the box is shielded from its keys).
            const backToGrid = () => {
              setAddressDraft(null);
              box.blur();
              p.onCancel();
            };
            if (e.key === 'Enter') {
              e.preventDefault();
              // Enter on the address as shown (nothing typed, or typed back the same) goes back to that cell.
              const typed = addressDraft?.trim() ?? '';
              if (typed === '' || typed.toUpperCase() === p.address.toUpperCase()) backToGrid();
              else if (p.onGoTo(typed)) {
                setAddressDraft(null);
                box.blur(); // typing goes to the cell now
              }
            } else if (e.key === 'Escape') {
              e.preventDefault();
              backToGrid();
            }
          }}
        />
        {/* Orbitab's own mark for "this cell holds": the defining-equals sign (≔). */}
        <span aria-hidden="true" title="The cell holds: a value, or a formula starting with =" className="flex h-5 items-center rounded-sm bg-raised px-1 font-mono text-caption text-accent" data-testid="input-mark">
          ≔
        </span>
        <input
          ref={field}
          aria-label="Formula bar"
          spellCheck={false}
          disabled={p.disabled}
          className="h-6 min-w-0 flex-1 rounded-ctl border border-transparent bg-transparent px-1.5 font-mono text-ui text-ink focus:border-accent focus:bg-surface focus:outline-none disabled:text-ink-2"
          value={text}
          onChange={(e) => {
            pointed.current = null;
            setDraft(e.target.value);
            setCaret(e.target.selectionStart ?? e.target.value.length);
          }}
          onSelect={(e) => setCaret(e.currentTarget.selectionStart ?? 0)}
          onFocus={() => {
            // Opened from the keyboard: the typed character (or the input) becomes the draft; a value
            // set on a focused field leaves the caret at its end, so keys typed next follow it.
            const start = pendingCaret.current;
            pendingCaret.current = null;
            setDraft(start ?? p.input);
          }}
          onBlur={() => setDraft(null)}
          onKeyDown={(e) => {
            if (suggestions.handleKey(e, setDraft)) return;
            if (arrowPoint(e)) return;
            if (e.key === 'Enter') {
              e.preventDefault();
              if (draft !== null && closeBrackets(draft) !== p.input) p.onCommit(closeBrackets(draft));
              else p.onCancel();
              setDraft(null);
              e.currentTarget.blur(); // the keyboard goes back to the grid
            } else if (e.key === 'Escape') {
              e.preventDefault();
              setDraft(null);
              e.currentTarget.blur();
              p.onCancel();
            }
          }}
        />
        <FunctionSuggestions state={suggestions} anchor={field} apply={setDraft} />
        {draft !== null && <ArgumentHint text={draft} caret={caret} anchor={field} hidden={suggestions.items.length > 0} />}
      </div>
      {(problem || p.readOnlyReason) && (
        <p role="status" className="flex items-center gap-2 border-t border-line bg-raised px-3 py-1 text-caption">
          {problem && (
            <span className="text-danger" data-testid="cell-error">
              {problem}
            </span>
          )}
          {p.readOnlyReason && <span className="text-ink-3">{p.readOnlyReason}</span>}
        </p>
      )}
    </div>
  );
}
