// The sheet on react-datasheet-grid: A1 column headers with width handles, row numbers that stay
// true under a filter, our memoised cell, virtualised rows and columns. Edits that the grid makes
// itself (typing, drag-fill) come back through onChange and are turned into cell inputs here.
import { useCallback, useEffect, useMemo, useRef, useState, type RefObject } from 'react';
// The package's default DataSheetGrid freezes columns and callbacks at first render; ours change
// (widths, frozen row, filter), so we use the dynamic variant and memoise what we pass instead.
import { DynamicDataSheetGrid, keyColumn, type Column, type DataSheetGridRef } from 'react-datasheet-grid';
import 'react-datasheet-grid/dist/style.css';
import '../grid.css';
import type { CellView } from '../../../core/workbook/model/cellView.js';
import { defaultColumnWidthPx } from '../../../core/workbook/model/displaySettings.js';
import type { RowData, WorkbookModel } from '../../../core/workbook/model/workbookModel.js';
import type { CellInput } from '../../../core/workbook/save/pendingStore.js';
import { ColumnHeader } from './ColumnHeader.js';
import { cellName } from '@shared/a1.js';
import { SheetCell, type CellColumnData } from './SheetCell.js';
import { PresenceMarks, type PresenceMark } from './PresenceMarks.js';

/** The grid's change notice (its type is not exported from the package index). */
type Operation = { type: 'UPDATE' | 'DELETE' | 'CREATE'; fromRowIndex: number; toRowIndex: number };

/** Marks a drag-filled cell with its source, so the fill can re-point formulas (the grid copies text). */
const FILL_MARK = '\u0000fill:';

export interface FillPair {
  from: { row: number; col: number };
  to: { row: number; col: number };
}

export interface ViewCell {
  row: number;
  col: number;
}

export interface SheetGridProps {
  model: WorkbookModel;
  sheetId: string;
  data: RowData[];
  /** View row → sheet row (null when they are the same). */
  rowMap: number[] | null;
  colCount: number;
  widths: Record<number, number>;
  frozenRow: RowData | null;
  focusedFrozenCol: number | null;
  gridRef: RefObject<DataSheetGridRef | null>;
  onActiveChange: (cell: ViewCell | null) => void;
  onSelectionChange: (sel: { min: ViewCell; max: ViewCell } | null) => void;
  onEditingChange: (editing: boolean) => void;
  onEditText: (text: string | null) => void;
  onResize: (col: number, px: number) => void;
  onResizeEnd: (col: number, px: number) => void;
  onPickFrozen: (col: number) => void;
  onCells: (changes: CellInput[], fills: FillPair[]) => void;
  /** Colleagues on this sheet and the cells they are on. */
  presence?: PresenceMark[];
}

/**
 * Marks the cell a formula being typed points at. Done on the element itself: the pointed cell
 * changes with every arrow key, and re-rendering the grid's cells for it would be wasted work.
 */
function markPointed(cell: { row: number; col: number } | null) {
  for (const el of document.querySelectorAll('.orb-cell-pointed')) el.classList.remove('orb-cell-pointed');
  if (cell) document.querySelector(`[data-testid="sheet-grid"] [data-view-row="${cell.row}"][data-col="${cell.col}"]`)?.classList.add('orb-cell-pointed');
}

function RowNumber({ rowIndex, columnData }: { rowIndex: number; columnData: number[] | null }) {
  return <span data-gutter-row={rowIndex}>{(columnData ? columnData[rowIndex] : rowIndex) + 1}</span>;
}

export function SheetGrid(p: SheetGridProps) {
  const box = useRef<HTMLDivElement>(null);
  const [height, setHeight] = useState(400);
  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const ro = new ResizeObserver(() => setHeight(Math.max(120, el.clientHeight)));
    ro.observe(el);
    return () => ro.disconnect();
  }, []);

  const rowMapRef = useRef(p.rowMap);
  rowMapRef.current = p.rowMap;
  const sheetRow = useCallback((viewRow: number) => (rowMapRef.current ? rowMapRef.current[viewRow] : viewRow), []);

  const onEditText = useRef(p.onEditText);
  onEditText.current = p.onEditText;
  const extent = useRef({ rows: p.data.length, cols: p.colCount });
  extent.current = { rows: p.data.length, cols: p.colCount };
  const columnData = useMemo<CellColumnData[]>(() => {
    const refFor = (viewRow: number, col: number) => cellName(sheetRow(viewRow), col);
    return Array.from({ length: p.colCount }, (_, col) => ({ col, onEditText: (t: string | null) => onEditText.current(t), refFor, extent: () => extent.current, onPoint: markPointed }));
  },
    // The sheet is a dependency on purpose: another sheet gets new column objects, so the grid
    // drops the previous sheet's cell state.
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [p.colCount, p.sheetId],
  );

  const { model, sheetId } = p;
  const columns = useMemo<Column<RowData>[]>(
    () =>
      columnData.map((cd, col) => {
        const base = keyColumn<RowData, string>(String(col), {
          component: SheetCell as never,
          columnData: cd,
          deleteValue: () => null,
          copyValue: ({ rowIndex }: { rowIndex: number }) => `${FILL_MARK}${sheetRow(rowIndex)}:${col}`,
          pasteValue: ({ value }: { value: string }) => ({ input: value }) as unknown as string,
          isCellEmpty: ({ rowData }: { rowData: CellView | null | undefined }) => !rowData,
        } as never);
        const width = p.widths[col] ?? defaultColumnWidthPx;
        return {
          ...base,
          id: String(col),
          title: (
            <ColumnHeader
              col={col}
              width={width}
              frozen={p.frozenRow ? { view: p.frozenRow[col], focused: p.focusedFrozenCol === col, onPick: p.onPickFrozen } : undefined}
              onResize={p.onResize}
              onResizeEnd={p.onResizeEnd}
            />
          ),
          basis: width,
          grow: 0,
          shrink: 0,
          minWidth: 36,
          disabled: ({ rowIndex }: { rowIndex: number }) => model.readOnlyReason(sheetId, sheetRow(rowIndex), col) !== null,
        } as Column<RowData>;
      }),
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [columnData, p.widths, p.frozenRow, p.focusedFrozenCol, model, sheetId],
  );

  const gutter = useMemo(
    () => ({
      component: RowNumber,
      columnData: p.rowMap,
      basis: 52,
      title: p.frozenRow ? <div className="flex h-full w-full flex-col"><span className="flex-1" /><span className="flex h-6 items-center justify-end border-t border-b-2 border-t-line border-b-line-strong pr-1.5">1</span></div> : undefined,
    }),
    [p.rowMap, p.frozenRow],
  );

  const dataRef = useRef(p.data);
  dataRef.current = p.data;
  const onCells = useRef(p.onCells);
  onCells.current = p.onCells;
  const onChange = useCallback(
    (next: RowData[], operations: Operation[]) => {
      const old = dataRef.current;
      const changes: CellInput[] = [];
      const fills: FillPair[] = [];
      for (const op of operations) {
        if (op.type !== 'UPDATE') continue;
        for (let i = op.fromRowIndex; i < op.toRowIndex; i++) {
          const before = old[i] ?? {};
          const after = next[i] ?? {};
          if (before === after) continue;
          for (const key of new Set([...Object.keys(before), ...Object.keys(after)])) {
            const was = (before[key] as CellView | undefined)?.input ?? '';
            const now = (after[key] as CellView | null | undefined)?.input ?? '';
            if (was === now) continue;
            const row = sheetRow(i);
            const col = Number(key);
            if (now.startsWith(FILL_MARK)) {
              const [fromRow, fromCol] = now.slice(FILL_MARK.length).split(':').map(Number);
              fills.push({ from: { row: fromRow, col: fromCol }, to: { row, col } });
            } else changes.push({ sheetId, row, col, input: now });
          }
        }
      }
      if (changes.length > 0 || fills.length > 0) onCells.current(changes, fills);
    },
    [sheetId, sheetRow],
  );

  return (
    <div ref={box} className="min-h-0 flex-1" data-testid="sheet-grid">
      <DynamicDataSheetGrid<RowData>
        ref={p.gridRef as RefObject<DataSheetGridRef>}
        className="orb-grid"
        value={p.data}
        onChange={onChange}
        columns={columns}
        gutterColumn={gutter}
        rowHeight={24}
        headerRowHeight={p.frozenRow ? 48 : 24}
        height={height}
        lockRows
        disableContextMenu
        disableSmartDelete
        onActiveCellChange={({ cell }) => p.onActiveChange(cell ? { row: cell.row, col: cell.col } : null)}
        onSelectionChange={({ selection }) => p.onSelectionChange(selection ? { min: { row: selection.min.row, col: selection.min.col }, max: { row: selection.max.row, col: selection.max.col } } : null)}
        onFocus={() => p.onEditingChange(true)}
        onBlur={() => p.onEditingChange(false)}
      />
      <PresenceMarks box={box} marks={p.presence ?? []} widths={p.widths} headerHeight={p.frozenRow ? 48 : 24} rowHeight={24} gutterWidth={52} />
    </div>
  );
}
