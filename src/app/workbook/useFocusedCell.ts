// The cell the user is on (the grid's active cell, or a cell of the frozen header row), its address
// or the selected range's, and what the structure panel reads of it.
import { useMemo } from 'react';
import { cellName, parseCellName, rangeName } from '../../../shared/a1.js';
import type { WorkbookModel } from '../../core/workbook/model/workbookModel.js';
import type { ViewCell } from '../../features/grid/components/SheetGrid.js';
import type { ViewSelection } from '../../features/grid/useSheetCommands.js';
import type { SheetView } from '../../features/grid/useSheetView.js';

export function useFocusedCell(model: WorkbookModel, sheetId: string, view: SheetView, at: { active: ViewCell | null; selection: ViewSelection | null; frozenPick: number | null }) {
  const { active, selection, frozenPick } = at;
  const focus = frozenPick !== null ? { row: 0, col: frozenPick } : active ? { row: view.sheetRow(active.row), col: active.col } : null;
  const focusView = focus ? model.view(sheetId, focus.row, focus.col) : undefined;
  const focusInput = focus ? model.input(sheetId, focus.row, focus.col) : '';
  const isRange = selection && frozenPick === null && (selection.min.row !== selection.max.row || selection.min.col !== selection.max.col);
  const address = !focus ? '' : isRange ? rangeName({ top: view.sheetRow(selection.min.row), left: selection.min.col, bottom: view.sheetRow(selection.max.row), right: selection.max.col }) : cellName(focus.row, focus.col);

  const structureSource = useMemo(
    () =>
      focus
        ? {
            input: focusInput,
            display: focusView?.kind === 'text' ? focusView.display : '',
            textOf: (a1: string) => {
              const ref = parseCellName(a1);
              const v = ref ? model.view(sheetId, ref.row, ref.col) : undefined;
              return v?.kind === 'text' ? v.display : null;
            },
          }
        : null,
    // The focused cell's row and column stand for `focus`, a new object on every render.
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [focusInput, focusView, sheetId, focus?.row, focus?.col],
  );
  return { focus, focusView, focusInput, address, structureSource };
}
