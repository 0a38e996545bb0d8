// The formula bar: the address of the cell in focus (type an address to jump), its input (edit it
// here as well as in the cell), and, for an error or a read-only cell, the reason in plain words.
import { useEffect, useImperativeHandle, useRef, useState, type Ref } from 'react';
import type { CellView } from '../../../core/workbook/model/cellView.js';
import { FunctionSuggestions, useFunctionSuggestions } from './FunctionSuggestions.js';

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
        <span aria-hidden="true" className="font-mono text-caption text-ink-3 italic">
          fx
        </span>
        <input
          ref={field}
          aria-label="Formula bar"
          spellCheck={false}
          disabled={p.disabled}
          className="h-6 min-w-0 flex-1 rounded-ctl border border-transparent bg-transparent px-1.5 font-mono text-ui text-ink focus:border-accent focus:bg-surface focus:outline-none disabled:text-ink-2"
          value={text}
          onChange={(e) => setDraft(e.target.value)}
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
            if (e.key === 'Enter') {
              e.preventDefault();
              if (draft !== null && draft !== p.input) p.onCommit(draft);
              else p.onCancel();
              setDraft(null);
            } else if (e.key === 'Escape') {
              e.preventDefault();
              setDraft(null);
              p.onCancel();
            }
          }}
        />
        <FunctionSuggestions state={suggestions} anchor={field} apply={setDraft} />
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
