// A column's header: its A1 letter, a drag handle on the right edge for the width, and, when the
// header row is frozen, the first row's value under the letter (click it to edit in the bar).
import { useRef, useState, type MouseEvent } from 'react';
import { columnName } from '../../../../shared/a1.js';
import { clampWidth } from '../../../core/workbook/model/displaySettings.js';
import type { CellView } from '../../../core/workbook/model/cellView.js';

export interface ColumnHeaderProps {
  col: number;
  width: number;
  /** The frozen first row's cell, when the header row is frozen. */
  frozen?: { view: CellView | undefined; focused: boolean; onPick: (col: number) => void };
  onResize: (col: number, widthPx: number) => void;
  onResizeEnd: (col: number, widthPx: number) => void;
}

export function ColumnHeader({ col, width, frozen, onResize, onResizeEnd }: ColumnHeaderProps) {
  const [dragging, setDragging] = useState(false);
  const latest = useRef(width);

  const startDrag = (e: MouseEvent) => {
    // Our own gesture: the grid must not start a column selection under it.
    e.preventDefault();
    e.stopPropagation();
    const startX = e.clientX;
    const startWidth = width;
    latest.current = width;
    setDragging(true);
    const move = (ev: globalThis.MouseEvent) => {
      latest.current = clampWidth(startWidth + ev.clientX - startX);
      onResize(col, latest.current);
    };
    const up = () => {
      window.removeEventListener('mousemove', move);
      window.removeEventListener('mouseup', up);
      setDragging(false);
      onResizeEnd(col, latest.current);
    };
    window.addEventListener('mousemove', move);
    window.addEventListener('mouseup', up);
  };

  const v = frozen?.view;
  return (
    <div className="orb-col-header" data-col={columnName(col)}>
      <span className="orb-col-letter">{columnName(col)}</span>
      {frozen && (
        <div
          className={`orb-col-frozen ${v?.kind === 'number' ? 'justify-end' : ''}`}
          data-focused={frozen.focused}
          title={v?.kind === 'error' ? v.errorMessage : v?.input}
          onMouseDown={(e) => {
            e.preventDefault();
            e.stopPropagation();
            frozen.onPick(col);
          }}
        >
          {v?.display}
        </div>
      )}
      <div
        role="separator"
        aria-orientation="vertical"
        aria-label={`Width of column ${columnName(col)}`}
        aria-valuenow={Math.round(width)}
        className="orb-col-resize"
        data-dragging={dragging}
        onMouseDown={startDrag}
        onDoubleClick={(e) => {
          e.stopPropagation();
          onResizeEnd(col, clampWidth(112));
        }}
      />
    </div>
  );
}
