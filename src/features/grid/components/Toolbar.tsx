// The sheet toolbar: history, rows and columns, fill, sort and filter, display settings, panels.
// Buttons do not take focus on click, so the grid keeps its active cell and the keyboard.
import type { ReactNode } from 'react';
import type { Precision } from '../../../core/workbook/model/cellView.js';

export interface ToolbarProps {
  canEdit: boolean;
  /** Why I only view this sheet: shown on every editing tool, which stays disabled. */
  viewOnlyReason?: string | null;
  canUndo: boolean;
  canRedo: boolean;
  hasCell: boolean;
  freezeHeaderRow: boolean;
  precision: Precision;
  panel: 'structure' | 'chart' | null;
  filterButton: ReactNode;
  onUndo: () => void;
  onRedo: () => void;
  onInsertRows: () => void;
  onDeleteRows: () => void;
  onInsertCols: () => void;
  onDeleteCols: () => void;
  onFillDown: () => void;
  onFillRight: () => void;
  onSort: (direction: 'ascending' | 'descending') => void;
  onFreeze: (on: boolean) => void;
  onPrecision: (p: Precision) => void;
  onPanel: (panel: 'structure' | 'chart' | null) => void;
}

function Tool({ label, title, onClick, disabled, pressed, why }: { label: string; title: string; onClick: () => void; disabled?: boolean; pressed?: boolean; why?: string | null }) {
  return (
    <button
      type="button"
      title={disabled && why ? `${title}\n${why}` : title}
      aria-pressed={pressed}
      disabled={disabled}
      onMouseDown={(e) => e.preventDefault()}
      onClick={onClick}
      className={`h-6 rounded-ctl px-2 text-caption font-medium whitespace-nowrap disabled:opacity-45 ${pressed ? 'bg-accent-soft text-accent' : 'text-ink-2 hover:bg-hover hover:text-ink'}`}
    >
      {label}
    </button>
  );
}

const Divider = () => <span aria-hidden="true" className="mx-1 h-4 w-px bg-line" />;

export function Toolbar(p: ToolbarProps) {
  const edit = p.canEdit && p.hasCell;
  const why = p.viewOnlyReason ?? null;
  const local = why ? ' — on this screen only, since you view this sheet' : '';
  return (
    <div
      role="toolbar"
      aria-label="Sheet tools"
      data-grid-shield=""
      onMouseDown={(e) => e.stopPropagation()}
      onKeyDown={(e) => e.stopPropagation()}
      className="flex h-8 shrink-0 items-center gap-0.5 overflow-x-auto border-b border-line bg-raised px-2"
    >
      <Tool why={why} label="Undo" title="Undo (Ctrl+Z)" onClick={p.onUndo} disabled={!p.canUndo || !p.canEdit} />
      <Tool why={why} label="Redo" title="Redo (Ctrl+Y)" onClick={p.onRedo} disabled={!p.canRedo || !p.canEdit} />
      <Divider />
      <Tool why={why} label="+ Row" title="Insert rows above the selection" onClick={p.onInsertRows} disabled={!edit} />
      <Tool why={why} label="− Row" title="Delete the selected rows" onClick={p.onDeleteRows} disabled={!edit} />
      <Tool why={why} label="+ Column" title="Insert columns left of the selection" onClick={p.onInsertCols} disabled={!edit} />
      <Tool why={why} label="− Column" title="Delete the selected columns" onClick={p.onDeleteCols} disabled={!edit} />
      <Divider />
      <Tool why={why} label="Fill ↓" title="Fill down from the top row of the selection (Ctrl+D)" onClick={p.onFillDown} disabled={!edit} />
      <Tool why={why} label="Fill →" title="Fill right from the left column of the selection (Ctrl+R)" onClick={p.onFillRight} disabled={!edit} />
      <Divider />
      <Tool why={why} label="Sort ↑" title="Sort the selected rows by the active column, smallest first" onClick={() => p.onSort('ascending')} disabled={!edit} />
      <Tool why={why} label="Sort ↓" title="Sort the selected rows by the active column, largest first" onClick={() => p.onSort('descending')} disabled={!edit} />
      {p.filterButton}
      <Divider />
      <Tool label="Freeze row 1" title={`Keep the first row in view while scrolling${local}`} pressed={p.freezeHeaderRow} onClick={() => p.onFreeze(!p.freezeHeaderRow)} />
      <label className="ml-1 flex items-center gap-1 text-caption text-ink-2" title={local ? `Decimal places${local}` : undefined}>
        Decimals
        <select
          aria-label="Decimal places"
          className="h-6 rounded-ctl border border-line bg-surface px-1 text-caption text-ink"
          value={p.precision === null ? 'auto' : String(p.precision)}
          onChange={(e) => p.onPrecision(e.target.value === 'auto' ? null : Number(e.target.value))}
        >
          <option value="auto">auto</option>
          {[0, 1, 2, 3, 4, 5, 6, 8, 10].map((n) => (
            <option key={n} value={n}>
              {n}
            </option>
          ))}
        </select>
      </label>
      <span className="ml-auto" />
      <Tool label="Structure" title="MO diagram or Hückel levels of the selected cell" pressed={p.panel === 'structure'} onClick={() => p.onPanel(p.panel === 'structure' ? null : 'structure')} />
      <Tool label="Chart" title="Plot two columns" pressed={p.panel === 'chart'} onClick={() => p.onPanel(p.panel === 'chart' ? null : 'chart')} />
    </div>
  );
}
