// The strip under a formula being typed, once the caret is inside a function's brackets: the
// parameters with the current one marked, and that parameter's meaning, unit, default and choices
// from the catalog. Hidden while the function list is open (that list shows the same signature).
import { createPortal } from 'react-dom';
import type { RefObject } from 'react';
import { argumentAt } from '@functions/formulaShape.js';
import { argumentHint } from '../formula/functionHelp.js';

export function ArgumentHint({ text, caret, anchor, hidden }: { text: string; caret: number; anchor: RefObject<HTMLElement | null>; hidden: boolean }) {
  const position = hidden || !anchor.current ? null : argumentAt(text, caret);
  const hint = position ? argumentHint(position.name, position.index) : null;
  if (!hint) return null;
  // Measured only when a hint shows: measuring forces a layout, too dear on every render of the bar.
  const rect = anchor.current?.getBoundingClientRect();
  if (!rect) return null;
  return createPortal(
    <div
      role="tooltip"
      aria-label="Argument hint"
      data-grid-shield=""
      data-testid="argument-hint"
      className="pointer-events-none fixed z-50 max-w-[32rem] rounded-panel border border-line bg-surface px-2.5 py-1.5 text-caption shadow-md"
      style={{ left: Math.min(rect.left, window.innerWidth - 520), top: rect.bottom + 2 }}
    >
      <p className="font-mono text-ink-2">
        {hint.name}(
        {hint.params.map((p, i) => (
          <span key={i}>
            {i > 0 && ', '}
            <span className={i === hint.current ? 'rounded-sm bg-accent-soft px-0.5 font-semibold text-accent' : undefined} aria-current={i === hint.current || undefined}>
              {p}
            </span>
          </span>
        ))}
        )
      </p>
      {hint.detail && <p className={hint.current === -1 ? 'text-danger' : 'text-ink-2'}>{hint.detail}</p>}
    </div>,
    document.body,
  );
}
