// Filter rows by a value of the active column: pick one of the column's values or type text the
// cells must contain. The filter hides rows in this view only; nothing is changed or sent.
import { useMemo, useRef, useState } from 'react';
import { columnName } from '../../../../shared/a1.js';
import { distinctValues, type FilterCriterion } from '../../../core/workbook/model/sortFilter.js';

export interface SheetFilter {
  col: number;
  criterion: FilterCriterion;
}

export function describeFilter(f: SheetFilter): string {
  return `${columnName(f.col)} ${f.criterion.kind === 'equals' ? '=' : 'contains'} “${f.criterion.text}”`;
}

export function FilterMenu({ col, values, filter, onApply }: { col: number | null; values: () => string[]; filter: SheetFilter | null; onApply: (f: SheetFilter | null) => void }) {
  const [open, setOpen] = useState(false);
  const button = useRef<HTMLButtonElement>(null);
  const at = open ? button.current?.getBoundingClientRect() : undefined;
  const [text, setText] = useState('');
  const choices = useMemo(() => (open ? distinctValues(values(), 100) : []), [open, values]);
  return (
    <div className="relative flex items-center gap-1" data-grid-shield="">
      <button
        ref={button}
        type="button"
        title="Show only rows whose value in the active column matches"
        disabled={col === null}
        aria-expanded={open}
        onMouseDown={(e) => e.preventDefault()}
        onClick={() => setOpen((o) => !o)}
        className={`h-6 rounded-ctl px-2 text-caption font-medium disabled:opacity-45 ${filter ? 'bg-accent-soft text-accent' : 'text-ink-2 hover:bg-hover hover:text-ink'}`}
      >
        Filter…
      </button>
      {filter && (
        <span className="flex items-center gap-1 rounded-ctl border border-accent-line bg-surface pl-1.5 text-caption text-ink" data-testid="active-filter">
          {describeFilter(filter)}
          <button type="button" aria-label="Clear the filter" className="px-1 text-ink-3 hover:text-ink" onClick={() => onApply(null)}>
            ×
          </button>
        </span>
      )}
      {open && col !== null && (
        <div role="dialog" aria-label={`Filter column ${columnName(col)}`} className="fixed z-40 w-64 rounded-panel border border-line bg-surface p-2 text-ui shadow-lg" style={{ top: (at?.bottom ?? 0) + 4, left: at?.left ?? 0 }}>
          <form
            className="flex gap-1"
            onSubmit={(e) => {
              e.preventDefault();
              if (text.trim()) onApply({ col, criterion: { kind: 'contains', text } });
              setOpen(false);
            }}
          >
            <input
              autoFocus
              aria-label="Cells contain"
              placeholder={`${columnName(col)} contains…`}
              value={text}
              onChange={(e) => setText(e.target.value)}
              className="h-7 min-w-0 flex-1 rounded-ctl border border-line bg-surface px-1.5 font-mono text-caption focus:border-accent focus:outline-none"
            />
            <button type="submit" className="h-7 rounded-ctl bg-accent px-2 text-caption font-medium text-on-accent">
              Apply
            </button>
          </form>
          <ul className="mt-2 max-h-60 overflow-y-auto">
            {choices.map((c) => (
              <li key={c.text}>
                <button
                  type="button"
                  className="flex w-full items-center justify-between rounded-ctl px-1.5 py-0.5 text-left font-mono text-caption hover:bg-hover"
                  onClick={() => {
                    onApply({ col, criterion: { kind: 'equals', text: c.text } });
                    setOpen(false);
                  }}
                >
                  <span className="truncate">{c.text === '' ? '(empty)' : c.text}</span>
                  <span className="text-ink-3">{c.count}</span>
                </button>
              </li>
            ))}
          </ul>
        </div>
      )}
    </div>
  );
}
