// Right-click on the sheet: on a cell, a row number or a column letter, the toolbar's actions for
// what was clicked (the whole row or column is selected first when its header was clicked). Each
// action runs the same command as its toolbar button or key, read when chosen, so it acts on the
// selection as it is then.
import { useEffect, useRef, useState, type RefObject } from 'react';
import type { DataSheetGridRef } from 'react-datasheet-grid';
import { columnIndex } from '@shared/a1.js';
import { ContextMenu, type MenuGroups } from '../../components/ui/ContextMenu.js';
import type { useSheetCommands } from '../../features/grid/useSheetCommands.js';

type Commands = ReturnType<typeof useSheetCommands>;
type Target = { kind: 'cell' | 'row' | 'column'; x: number; y: number };

export interface GridMenuProps {
  gridRef: RefObject<DataSheetGridRef | null>;
  commands: Commands;
  extent: () => { rows: number; cols: number };
  /** Why cells cannot be changed here (null: they can), and why rows/columns cannot be added or removed. */
  editBlocked: string | null;
  structureBlocked: string | null;
  canUndo: boolean;
  canRedo: boolean;
  say: (message: string) => void;
}

export function GridMenu(p: GridMenuProps) {
  const [target, setTarget] = useState<Target | null>(null);
  const latest = useRef(p);
  latest.current = p;

  useEffect(() => {
    const open = (e: MouseEvent) => {
      const el = e.target instanceof HTMLElement ? e.target : null;
      if (!el?.closest('[data-testid="sheet-grid"]')) return;
      const grid = latest.current.gridRef.current;
      if (!grid) return;
      const { rows, cols } = latest.current.extent();
      const header = el.closest<HTMLElement>('.orb-col-header');
      const gutter = el.closest('.dsg-cell-gutter')?.querySelector<HTMLElement>('[data-gutter-row]');
      const cell = el.closest<HTMLElement>('[data-view-row]');
      let kind: Target['kind'];
      if (header) {
        const col = columnIndex(header.dataset.col ?? '');
        if (col === null) return;
        kind = 'column';
        grid.setSelection({ min: { row: 0, col }, max: { row: rows - 1, col } });
      } else if (gutter) {
        const row = Number(gutter.dataset.gutterRow);
        kind = 'row';
        grid.setSelection({ min: { row, col: 0 }, max: { row, col: cols - 1 } });
      } else if (cell) kind = 'cell';
      else return;
      e.preventDefault();
      setTarget({ kind, x: e.clientX, y: e.clientY });
    };
    window.addEventListener('contextmenu', open, true);
    return () => window.removeEventListener('contextmenu', open, true);
  }, []);

  if (!target) return null;
  const run = (f: (c: Commands) => void) => () => f(latest.current.commands);
  const edit = p.editBlocked;
  const structure = p.editBlocked ?? p.structureBlocked;
  const clipboard = {
    copy: (cut: boolean) => () => {
      const text = latest.current.commands.copy(cut);
      if (text !== null) navigator.clipboard?.writeText(text).catch(() => latest.current.say('Copied here; the browser did not let Orbitab put it on the system clipboard.'));
    },
    paste: () => {
      navigator.clipboard
        ?.readText()
        .then((text) => latest.current.commands.paste(text))
        .catch(() => latest.current.say('The browser did not let Orbitab read the clipboard: paste with Ctrl+V instead.'));
    },
  };
  const clip = [
    { label: 'Cut', keys: 'Ctrl+X', run: clipboard.copy(true), unavailable: edit },
    { label: 'Copy', keys: 'Ctrl+C', run: clipboard.copy(false) },
    { label: 'Paste', keys: 'Ctrl+V', run: clipboard.paste, unavailable: edit },
    { label: 'Clear', keys: 'Delete', run: run((c) => c.clear()), unavailable: edit },
  ];
  const sort = [
    { label: target.kind === 'column' ? 'Sort by this column, smallest first' : 'Sort, smallest first', run: run((c) => c.sort('ascending')), unavailable: edit },
    { label: target.kind === 'column' ? 'Sort by this column, largest first' : 'Sort, largest first', run: run((c) => c.sort('descending')), unavailable: edit },
  ];
  const rowsGroup = [
    { label: 'Insert rows above', run: run((c) => c.insertRows()), unavailable: structure },
    { label: 'Delete rows', run: run((c) => c.deleteRows()), unavailable: structure },
  ];
  const colsGroup = [
    { label: 'Insert columns to the left', run: run((c) => c.insertCols()), unavailable: structure },
    { label: 'Delete columns', run: run((c) => c.deleteCols()), unavailable: structure },
  ];
  const history = [
    { label: 'Undo', keys: 'Ctrl+Z', run: run((c) => c.undo()), unavailable: p.canUndo ? null : 'Nothing to undo' },
    { label: 'Redo', keys: 'Ctrl+Y', run: run((c) => c.redo()), unavailable: p.canRedo ? null : 'Nothing to redo' },
  ];
  const groups: MenuGroups =
    target.kind === 'column'
      ? [colsGroup, sort, clip]
      : target.kind === 'row'
        ? [rowsGroup, clip]
        : [
            clip,
            [
              { label: 'Fill down', keys: 'Ctrl+D', run: run((c) => c.fillDown()), unavailable: edit },
              { label: 'Fill right', keys: 'Ctrl+R', run: run((c) => c.fillRight()), unavailable: edit },
            ],
            sort,
            [...rowsGroup, ...colsGroup],
            history,
          ];
  const label = target.kind === 'column' ? 'Column actions' : target.kind === 'row' ? 'Row actions' : 'Cell actions';
  return <ContextMenu at={target} label={label} groups={groups} onClose={() => setTarget(null)} />;
}
