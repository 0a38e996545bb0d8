// The function list that opens while a formula's function name is typed, in a cell or in the
// formula bar: name, signature and one-line summary; arrows move, Tab or Enter accept, Esc closes.
import { useEffect, useRef, useState, type KeyboardEvent, type RefObject } from 'react';
import { createPortal } from 'react-dom';
import { acceptSuggestion, allFunctionHelp, functionTokenAt, suggestFunctions, type FunctionHelp, type FunctionToken } from '../formula/functionHelp.js';

export interface SuggestionState {
  items: FunctionHelp[];
  index: number;
  token: FunctionToken | null;
  /** Handles a key while the list is open; true when it used the key. */
  handleKey: (e: KeyboardEvent, apply: (text: string) => void) => boolean;
  accept: (i: number, apply: (text: string) => void) => void;
}

export function useFunctionSuggestions(text: string, input: RefObject<HTMLInputElement | null>): SuggestionState {
  const [index, setIndex] = useState(0);
  const [dismissedAt, setDismissedAt] = useState<string | null>(null);
  const caret = input.current?.selectionStart ?? text.length;
  const token = text.startsWith('=') ? functionTokenAt(text, caret) : null;
  const items = token && dismissedAt !== text ? suggestFunctions(token.prefix, allFunctionHelp()) : [];
  const prefix = token?.prefix;
  useEffect(() => setIndex(0), [prefix]);

  const accept = (i: number, apply: (t: string) => void) => {
    if (!token || !items[i]) return;
    const next = acceptSuggestion(text, token, items[i].name);
    apply(next.text);
    // The caret goes after the bracket as soon as the field holds the completed text: at once where
    // `apply` wrote the field itself (the cell editor), after React's commit where it sets state (the
    // formula bar). Never later than a key typed since: a caret placed by a late frame would jump back
    // before what was typed (=UNPAIRED(A1) read as =UNPAIRED(1)A).
    let placed = false;
    const place = () => {
      const el = input.current;
      if (placed || !el) return;
      if (el.value === next.text) el.setSelectionRange(next.caret, next.caret);
      // Typed over already: the typing put the caret where it belongs.
      if (el.value !== text) placed = true;
    };
    place();
    queueMicrotask(place);
    requestAnimationFrame(place);
  };

  const handleKey = (e: KeyboardEvent, apply: (t: string) => void) => {
    if (items.length === 0) return false;
    const stop = () => {
      e.preventDefault();
      e.stopPropagation(); // keeps the grid from moving the active cell
    };
    switch (e.key) {
      case 'ArrowDown':
        stop();
        setIndex((index + 1) % items.length);
        return true;
      case 'ArrowUp':
        stop();
        setIndex((index - 1 + items.length) % items.length);
        return true;
      case 'Tab':
      case 'Enter':
        stop();
        accept(index, apply);
        return true;
      case 'Escape':
        stop();
        setDismissedAt(text);
        return true;
      default:
        return false;
    }
  };
  return { items, index: Math.min(index, Math.max(0, items.length - 1)), token, handleKey, accept };
}

export function FunctionSuggestions({ state, anchor, apply }: { state: SuggestionState; anchor: RefObject<HTMLElement | null>; apply?: (text: string) => void }) {
  const list = useRef<HTMLDivElement>(null);
  useEffect(() => {
    list.current?.querySelector('[aria-selected="true"]')?.scrollIntoView({ block: 'nearest' });
  }, [state.index]);
  if (state.items.length === 0) return null;
  // Read only while the list is open: measuring forces a layout, which on every render of the formula
  // bar (each slice of computed values) held the page for a long task.
  const rect = anchor.current?.getBoundingClientRect();
  if (!rect) return null;
  const chosen = state.items[state.index];
  return createPortal(
    <div
      ref={list}
      role="listbox"
      aria-label="Functions"
      data-grid-shield=""
      onMouseDown={(e) => {
        e.preventDefault(); // keep the caret in the input
        e.stopPropagation();
      }}
      className="fixed z-50 w-[26rem] max-w-[90vw] overflow-hidden rounded-panel border border-line bg-surface text-ui shadow-lg"
      style={{ left: Math.min(rect.left, window.innerWidth - 420), top: rect.bottom + 2 }}
    >
      <ul className="max-h-56 overflow-y-auto py-1">
        {state.items.map((h, i) => (
          <li
            key={h.name}
            role="option"
            aria-selected={i === state.index}
            onClick={() => apply && state.accept(i, apply)}
            className={`flex items-baseline gap-2 px-2.5 py-1 ${i === state.index ? 'bg-accent-soft' : 'hover:bg-hover'}`}
          >
            <span className="font-mono font-medium text-ink">{h.name}</span>
            {h.origin === 'orbitab' && <span className="rounded-sm bg-raised px-1 text-caption text-accent">chem</span>}
            <span className="truncate font-mono text-caption text-ink-3">{h.signature.slice(h.name.length)}</span>
          </li>
        ))}
      </ul>
      <div className="border-t border-line bg-raised px-2.5 py-1.5">
        <p className="font-mono text-caption text-ink">{chosen.signature}</p>
        <p className="text-caption text-ink-2">{chosen.summary}</p>
      </div>
    </div>,
    document.body,
  );
}
