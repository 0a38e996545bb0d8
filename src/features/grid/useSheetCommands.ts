// What the toolbar, the keyboard and the clipboard do to the sheet, on the current selection.
// Every command goes through the model (engine first, then the save queue) and reports cells it
// had to leave alone, so nothing is dropped silently.
import { useRef } from 'react';
import { applyStructural, redoLast, undoLast, type StructuralOp } from '../../core/workbook/model/structure.js';
import { blockValues, clearRange, fillPairs, pasteBlock, pasteCopiedCells, pasteRepeats, sortRange, tileBlock, type CopiedCells } from '../../core/workbook/model/rangeEdits.js';
import { formatTsv, parseTsv } from '../../core/workbook/model/tsv.js';
import { shiftColumnWidths, type DisplaySettings } from '../../core/workbook/model/displaySettings.js';
import { looksLikeHeader, type SortDirection } from '../../core/workbook/model/sortFilter.js';
import type { CellRange } from '@shared/a1.js';
import type { EditOutcome } from '../../core/workbook/model/workbookModel.js';
import type { WorkbookSession } from '../../core/workbook/session/useWorkbookSession.js';
import type { SheetView } from './useSheetView.js';
import type { FillPair, ViewCell } from './components/SheetGrid.js';
import { plural } from '@shared/plural.js';

export interface ViewSelection {
  min: ViewCell;
  max: ViewCell;
}

export interface CommandContext {
  session: WorkbookSession;
  sheetId: string;
  view: SheetView;
  /** The selection now (read when a command runs, so fast keyboard use is not a step behind). */
  getSelection: () => ViewSelection | null;
  /** The active cell's column: the key column for sorting. */
  activeCol: number | null;
  filtered: boolean;
  display: DisplaySettings;
  setDisplay: (d: DisplaySettings) => void;
  say: (message: Notice) => void;
  select: (sel: ViewSelection) => void;
}

/** One line of feedback, optionally with one thing to do about it (a button beside the words). */
export type Notice = string | { text: string; action: { label: string; run: () => void } } | null;

const sentence = (text: string) => (/[.!?]$/.test(text) ? text : `${text}.`);

export function useSheetCommands(ctx: CommandContext) {
  const clipboard = useRef<{ text: string; source: CopiedCells } | null>(null);
  const c = ctx;
  const { model } = c.session;

  /** `done` names a whole-or-nothing action (fill, sort, paste), which one refused cell stops entirely. */
  const report = (outcome: EditOutcome, done?: string) => {
    const reason = outcome.refused[0]?.reason;
    if (reason && done && outcome.applied.length === 0) c.say(`Not ${done}: ${sentence(reason)}`);
    else if (reason) c.say(`${plural(outcome.refused.length, 'cell')} left unchanged: ${sentence(reason)}`);
    else c.say(null);
  };
  const guard = (action: () => void, refused = '') => {
    try {
      action();
    } catch (e) {
      c.say(refused + sentence((e as Error).message));
    }
  };
  const viewRows = (sel: ViewSelection) => Array.from({ length: sel.max.row - sel.min.row + 1 }, (_, i) => c.view.sheetRow(sel.min.row + i));
  const span = (sel: ViewSelection) => ({ top: c.view.sheetRow(sel.min.row), bottom: c.view.sheetRow(sel.max.row), left: sel.min.col, right: sel.max.col });
  const noFilter = (what: string) => {
    if (c.filtered) c.say(`Clear the filter before you ${what}: hidden rows would be affected too.`);
    return !c.filtered;
  };

  const structural = (op: StructuralOp) => {
    try {
      applyStructural(model, c.sheetId, op);
    } catch (e) {
      // A lock or protected range (or the engine) refused it: nothing changed here, nothing is sent.
      c.say(`${op.axis === 'row' ? 'Rows' : 'Columns'} not ${op.action === 'insert' ? 'inserted' : 'deleted'}: ${sentence((e as Error).message)}`);
      return;
    }
    if (op.axis === 'col') c.setDisplay({ ...c.display, columnWidths: shiftColumnWidths(c.display.columnWidths, op.at, op.action === 'insert' ? op.count : -op.count) });
    c.say(null);
  };

  const rowsOp = (action: StructuralOp['action']) => {
    const sel = c.getSelection();
    if (!sel || !noFilter(action === 'insert' ? 'insert rows' : 'delete rows')) return;
    structural({ axis: 'row', action, at: span(sel).top, count: sel.max.row - sel.min.row + 1 });
  };
  const colsOp = (action: StructuralOp['action']) => {
    const sel = c.getSelection();
    if (sel) structural({ axis: 'col', action, at: sel.min.col, count: sel.max.col - sel.min.col + 1 });
  };

  return {
    undo: () => guard(() => void (undoLast(model) || c.say('Nothing to undo.')), 'Not undone: '),
    redo: () => guard(() => void (redoLast(model) || c.say('Nothing to redo.')), 'Not redone: '),
    insertRows: () => rowsOp('insert'),
    deleteRows: () => rowsOp('remove'),
    insertCols: () => colsOp('insert'),
    deleteCols: () => colsOp('remove'),

    /** Ctrl+D: the top row of the selection into the rows below (one row: from the row above). */
    fillDown: () => {
      const sel = c.getSelection();
      if (!sel) return;
      const from = sel.min.row === sel.max.row ? sel.min.row - 1 : sel.min.row;
      if (from < 0) return;
      const pairs: FillPair[] = [];
      for (let v = from + 1; v <= sel.max.row; v++) for (let col = sel.min.col; col <= sel.max.col; col++) pairs.push({ from: { row: c.view.sheetRow(from), col }, to: { row: c.view.sheetRow(v), col } });
      guard(() => report(fillPairs(model, c.sheetId, pairs), 'filled'));
    },
    /** Ctrl+R: the left column of the selection into the columns to its right. */
    fillRight: () => {
      const sel = c.getSelection();
      if (!sel) return;
      const from = sel.min.col === sel.max.col ? sel.min.col - 1 : sel.min.col;
      if (from < 0) return;
      const pairs: FillPair[] = [];
      for (const row of viewRows(sel)) for (let col = from + 1; col <= sel.max.col; col++) pairs.push({ from: { row, col: from }, to: { row, col } });
      guard(() => report(fillPairs(model, c.sheetId, pairs), 'filled'));
    },
    sort: (direction: SortDirection) => {
      const sel = c.getSelection();
      if (!sel || !noFilter('sort')) return;
      let range = span(sel);
      if (range.top === range.bottom) {
        // One cell selected: sort the whole used block below the (frozen) header row.
        const { rows, cols } = model.sheet(c.sheetId).inputs.extent();
        range = { top: c.display.freezeHeaderRow ? 1 : 0, bottom: Math.max(0, rows - 1), left: 0, right: Math.max(0, cols - 1) };
      }
      const keyCol = c.activeCol ?? sel.min.col;
      // Row 1 not frozen: a row of titles over numbers stays where it is, and the user may say otherwise.
      if (range.top === 0 && range.bottom > 0 && looksLikeHeader(blockValues(model, c.sheetId, range))) {
        const withHeader = range;
        const body: CellRange = { ...range, top: 1 };
        guard(() => {
          const outcome = sortRange(model, c.sheetId, body, keyCol, direction);
          report(outcome, 'sorted');
          if (outcome.refused.length > 0) return;
          const step = model.history.lastUndo;
          const include = () =>
            guard(() => {
              // Take back the sort that kept the header (only if it is still the last step), then sort all.
              if (outcome.applied.length > 0 && model.history.lastUndo === step) undoLast(model);
              report(sortRange(model, c.sheetId, withHeader, keyCol, direction), 'sorted');
            });
          c.say({ text: 'Row 1 reads as a header (titles over numbers), so it stayed on top.', action: { label: 'Sort row 1 with the data', run: include } });
        });
        return;
      }
      guard(() => report(sortRange(model, c.sheetId, range, keyCol, direction), 'sorted'));
    },
    clear: () => {
      const sel = c.getSelection();
      if (!sel) return;
      guard(() => report(clearRange(model, c.sheetId, viewRows(sel), sel.min.col, sel.max.col)));
    },
    copy: (cut: boolean): string | null => {
      const sel = c.getSelection();
      if (!sel) return null;
      const rows = viewRows(sel);
      const text = formatTsv(rows.map((row) => Array.from({ length: sel.max.col - sel.min.col + 1 }, (_, j) => model.view(c.sheetId, row, sel.min.col + j)?.display ?? '')));
      clipboard.current = { text, source: { sheetId: c.sheetId, rows, left: sel.min.col, right: sel.max.col } };
      if (cut) guard(() => report(pasteBlock(model, c.sheetId, rows, sel.min.col, rows.map(() => Array<string>(sel.max.col - sel.min.col + 1).fill(''))), 'cut'));
      return text;
    },
    paste: (text: string, table?: string[][]) => {
      const sel = c.getSelection();
      if (!sel) return;
      const selection = { height: sel.max.row - sel.min.row + 1, width: sel.max.col - sel.min.col + 1 };
      const internal = clipboard.current && !table && text === clipboard.current.text ? clipboard.current.source : null;
      guard(() => {
        const block = internal ? null : (table ?? parseTsv(text));
        const size = internal ? { height: internal.rows.length, width: internal.right - internal.left + 1 } : { height: block!.length, width: Math.max(...block!.map((r) => r.length)) };
        const repeats = pasteRepeats(selection, size);
        const height = size.height * repeats.down;
        const width = size.width * repeats.across;
        const rows = c.view.rowsFrom(sel.min.row, height);
        const outcome = internal ? pasteCopiedCells(model, c.sheetId, rows, sel.min.col, internal, repeats) : pasteBlock(model, c.sheetId, rows, sel.min.col, tileBlock(block!, repeats.down, repeats.across));
        report(outcome, 'pasted');
        if (outcome.refused.length === 0 && repeats.note) c.say(repeats.note);
        c.select({ min: sel.min, max: { row: sel.min.row + height - 1, col: sel.min.col + width - 1 } });
      });
    },
  };
}
