// The open workbook: title and save state, toolbar, formula bar, the sheet, the side panel and the
// sheet tabs. Holds the view state (active sheet, selection, filter, live column widths); the data
// lives in the model.
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { DataSheetGridRef } from 'react-datasheet-grid';
import { ChartPanel } from '../chart/ChartPanel.js';
import { SafetyNote } from '../diagram/SafetyNote.js';
import { StructurePanel } from '../diagram/StructurePanel.js';
import { cellName, parseCellName, rangeName } from '../../../shared/a1.js';
import type { DisplaySettings } from './model/displaySettings.js';
import { fillPairs } from './model/rangeEdits.js';
import { FilterMenu, type SheetFilter } from './components/FilterMenu.js';
import { FormulaBar } from './components/FormulaBar.js';
import { SaveIndicator } from './components/SaveIndicator.js';
import { SheetGrid, type ViewCell } from './components/SheetGrid.js';
import { SheetTabs } from './components/SheetTabs.js';
import { StarterTemplate } from './StarterTemplate.js';
import { Toolbar } from './components/Toolbar.js';
import { useSheetKeys } from './components/useSheetKeys.js';
import { addSheet, deleteSheet, moveSheet, renameSheet, saveDisplaySettings } from './session/sheetActions.js';
import { useModelVersion, useSaveStatus, type WorkbookSession } from './session/useWorkbookSession.js';
import { useSheetCommands, type ViewSelection } from './useSheetCommands.js';
import { useSheetView } from './useSheetView.js';
import { ConflictResolver } from '../live/ConflictResolver.js';
import { lockSummary } from '../locks/SheetLockSection.js';
import { TeamNotices } from '../live/TeamNotices.js';
import { TeamToolbar } from '../live/TeamToolbar.js';
import { useWorkbookTeam } from '../live/useWorkbookTeam.js';
import { ExportMenu } from '../io/index.js';

function gridSelection(grid: DataSheetGridRef | null): ViewSelection | null {
  const s = grid?.selection;
  return s ? { min: { row: s.min.row, col: s.min.col }, max: { row: s.max.row, col: s.max.col } } : null;
}

export function Workspace({ session }: { session: WorkbookSession }) {
  const { model, queue, store } = session;
  useModelVersion(model);
  const status = useSaveStatus(queue);
  const sheets = model.sheets;
  const [sheetId, setSheetId] = useState(sheets[0]?.id ?? '');
  const activeSheetId = model.hasSheet(sheetId) ? sheetId : (sheets[0]?.id ?? '');
  const sheet = model.sheet(activeSheetId);
  const display = sheet.display;

  const [filters, setFilters] = useState<Record<string, SheetFilter | null>>({});
  const filter = filters[activeSheetId] ?? null;
  const [dragWidths, setDragWidths] = useState<Record<number, number>>({});
  const [active, setActive] = useState<ViewCell | null>(null);
  const [selection, setSelection] = useState<ViewSelection | null>(null);
  const [frozenPick, setFrozenPick] = useState<number | null>(null);
  const [liveText, setLiveText] = useState<string | null>(null);
  const [panel, setPanel] = useState<'structure' | 'chart' | null>('structure');
  const [message, setMessage] = useState<string | null>(session.restored > 0 ? `${session.restored} unsent change${session.restored === 1 ? '' : 's'} from your last visit restored; sending now.` : null);
  const editing = useRef(false);
  const gridRef = useRef<DataSheetGridRef>(null);
  const view = useSheetView(model, activeSheetId, display.freezeHeaderRow, filter);

  // Display settings are saved on the sheet (debounced) so widths and precision follow the workbook.
  const saveTimer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const setDisplay = useCallback(
    (next: DisplaySettings) => {
      model.setDisplay(activeSheetId, next);
      if (saveTimer.current) clearTimeout(saveTimer.current);
      const id = activeSheetId;
      saveTimer.current = setTimeout(() => saveDisplaySettings(session, id, next).catch((e: Error) => setMessage(`Display settings not saved: ${e.message}`)), 500);
    },
    [model, session, activeSheetId],
  );

  const switchSheet = (id: string) => {
    setSheetId(id);
    setActive(null);
    setSelection(null);
    setFrozenPick(null);
    gridRef.current?.setActiveCell(null);
  };

  const focus = frozenPick !== null ? { row: 0, col: frozenPick } : active ? { row: view.sheetRow(active.row), col: active.col } : null;
  const focusView = focus ? model.view(activeSheetId, focus.row, focus.col) : undefined;
  const focusInput = focus ? model.input(activeSheetId, focus.row, focus.col) : '';
  const address = focus ? (selection && frozenPick === null && (selection.min.row !== selection.max.row || selection.min.col !== selection.max.col) ? rangeName({ top: view.sheetRow(selection.min.row), left: selection.min.col, bottom: view.sheetRow(selection.max.row), right: selection.max.col }) : cellName(focus.row, focus.col)) : '';

  // Colleagues: live revisions, presence (my cursor), locks and protected ranges as the grid's edit rule.
  const team = useWorkbookTeam(session, focus ? { sheetId: activeSheetId, row: focus.row, col: focus.col } : null);

  const commands = useSheetCommands({
    session,
    sheetId: activeSheetId,
    view,
    // The grid's own selection is current even before React state catches up (fast keyboard use).
    getSelection: () => (frozenPick !== null ? { min: { row: -1, col: frozenPick }, max: { row: -1, col: frozenPick } } : (gridSelection(gridRef.current) ?? selection)),
    activeCol: focus?.col ?? null,
    filtered: filter !== null,
    display,
    setDisplay,
    say: setMessage,
    select: (sel) => requestAnimationFrame(() => gridRef.current?.setSelection(sel)),
  });

  useSheetKeys({
    gridRef,
    isEditing: () => editing.current,
    extent: () => ({ rows: view.data.length, cols: sheet.colCount }),
    lastUsed: () => {
      const { rows, cols } = sheet.inputs.extent();
      let row = view.data.length - 1;
      while (row > 0 && view.sheetRow(row) > rows - 1) row--;
      return { row, col: Math.max(0, cols - 1) };
    },
    lastUsedColInRow: (r) => Math.max(0, ...Object.keys(view.data[r] ?? {}).map(Number)),
    pageRows: () => Math.max(1, Math.floor((document.querySelector('[data-testid="sheet-grid"]')?.clientHeight ?? 480) / 24) - 2),
    ...commands,
  });

  const structureSource = useMemo(
    () =>
      focus
        ? {
            input: focusInput,
            display: focusView?.kind === 'text' ? focusView.display : '',
            textOf: (a1: string) => {
              const ref = parseCellName(a1);
              const v = ref ? model.view(activeSheetId, ref.row, ref.col) : undefined;
              return v?.kind === 'text' ? v.display : null;
            },
          }
        : null,
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [focusInput, focusView, activeSheetId, focus?.row, focus?.col],
  );

  const widths = useMemo(() => ({ ...display.columnWidths, ...dragWidths }), [display.columnWidths, dragWidths]);
  useEffect(() => setDragWidths({}), [display.columnWidths]);
  const returnToGrid = () => {
    if (active) gridRef.current?.setActiveCell(active);
  };

  return (
    <div className="flex h-full min-h-0 flex-col bg-canvas">
      <div className="flex h-9 shrink-0 items-center gap-3 border-b border-line bg-surface px-3" data-grid-shield="">
        <h1 className="truncate text-ui font-semibold" data-testid="workbook-title">
          {model.title}
        </h1>
        {model.readOnly && <span className="rounded-ctl bg-raised px-1.5 text-caption text-ink-3">read-only</span>}
        <span className="ml-auto" />
        <TeamToolbar team={team} model={model} activeSheet={{ id: activeSheetId, name: sheet.name }} selectionRange={address || undefined} />
        {/* Every role may export, viewers included (the API checks the same). */}
        <ExportMenu workbookId={model.id} activeSheet={{ id: activeSheetId, name: sheet.name }} />
        <SaveIndicator status={status} storageWorks={store.storageWorks} />
      </div>
      <ConflictResolver session={session} status={status} onSetAside={team.addSetAside} />
      <Toolbar
        canEdit={!model.readOnly}
        canUndo={model.history.canUndo}
        canRedo={model.history.canRedo}
        hasCell={selection !== null || frozenPick !== null}
        freezeHeaderRow={display.freezeHeaderRow}
        precision={display.precision}
        panel={panel}
        filterButton={
          <FilterMenu
            col={focus?.col ?? null}
            filter={filter}
            values={() => view.rows.slice(display.freezeHeaderRow ? 1 : 0, sheet.inputs.extent().rows).map((r) => (focus ? (r[focus.col]?.display ?? '') : ''))}
            onApply={(f) => {
              setFilters((all) => ({ ...all, [activeSheetId]: f }));
              gridRef.current?.setActiveCell({ row: 0, col: focus?.col ?? 0 });
            }}
          />
        }
        onUndo={commands.undo}
        onRedo={commands.redo}
        onInsertRows={commands.insertRows}
        onDeleteRows={commands.deleteRows}
        onInsertCols={commands.insertCols}
        onDeleteCols={commands.deleteCols}
        onFillDown={commands.fillDown}
        onFillRight={commands.fillRight}
        onSort={commands.sort}
        onFreeze={(on) => setDisplay({ ...display, freezeHeaderRow: on })}
        onPrecision={(p) => setDisplay({ ...display, precision: p })}
        onPanel={setPanel}
      />
      <FormulaBar
        address={address}
        input={focusInput}
        liveText={liveText}
        view={focusView}
        readOnlyReason={focus ? model.readOnlyReason(activeSheetId, focus.row, focus.col) : null}
        disabled={!focus || model.readOnly}
        onCommit={(input) => {
          if (!focus) return;
          const outcome = model.edit([{ sheetId: activeSheetId, row: focus.row, col: focus.col, input }]);
          setMessage(outcome.refused[0] ? `Not changed: ${outcome.refused[0].reason}.` : null);
          returnToGrid();
        }}
        onCancel={returnToGrid}
        onGoTo={(text) => {
          const ref = parseCellName(text);
          if (!ref) return false;
          if (display.freezeHeaderRow && ref.row === 0) {
            setFrozenPick(ref.col);
            return true;
          }
          const v = view.viewRowOf(ref.row);
          if (v === null) return false;
          gridRef.current?.setActiveCell({ row: v, col: ref.col });
          return true;
        }}
      />
      {message && (
        <div role="status" data-grid-shield="" className="flex shrink-0 items-center gap-2 border-b border-caution-line bg-caution-soft px-3 py-1 text-caption text-ink" data-testid="sheet-message">
          {message}
          <button type="button" className="ml-auto text-ink-3 hover:text-ink" aria-label="Dismiss" onClick={() => setMessage(null)}>
            ×
          </button>
        </div>
      )}
      <TeamNotices team={team} model={model} activeSheetId={activeSheetId} />
      <StarterTemplate model={model} sheetId={activeSheetId} />
      <div className="flex min-h-0 flex-1">
        <div className="flex min-w-0 flex-1 flex-col">
          <SheetGrid
            model={model}
            sheetId={activeSheetId}
            data={view.data}
            rowMap={view.rowMap}
            colCount={sheet.colCount}
            widths={widths}
            frozenRow={view.frozenRow}
            focusedFrozenCol={frozenPick}
            gridRef={gridRef}
            onActiveChange={(cell) => {
              setActive(cell);
              if (cell) setFrozenPick(null);
            }}
            onSelectionChange={setSelection}
            onEditingChange={(on) => {
              editing.current = on;
              if (!on) setLiveText(null);
            }}
            onEditText={setLiveText}
            onResize={(col, px) => setDragWidths((w) => ({ ...w, [col]: px }))}
            onResizeEnd={(col, px) => setDisplay({ ...display, columnWidths: { ...display.columnWidths, [col]: px } })}
            onPickFrozen={(col) => {
              setFrozenPick(col);
              gridRef.current?.setActiveCell(null);
            }}
            onCells={(changes, fills) => {
              const a = model.edit(changes);
              const b = fillPairs(model, activeSheetId, fills);
              const refused = [...a.refused, ...b.refused];
              setMessage(refused.length ? `${refused.length} cell${refused.length === 1 ? '' : 's'} left unchanged: ${refused[0].reason}.` : null);
            }}
          />
        </div>
        {panel && (
          <aside aria-label={panel === 'structure' ? 'Structure of the selected cell' : 'Chart'} data-grid-shield="" onMouseDown={(e) => e.stopPropagation()} className="flex w-[26rem] shrink-0 flex-col overflow-y-auto border-l border-line bg-surface">
            <div className="flex-1">
              {panel === 'structure' ? (
                <StructurePanel source={structureSource} address={address} />
              ) : (
                <ChartPanel rows={view.rows} colCount={sheet.colCount} firstRow={display.freezeHeaderRow ? 1 : 0} headerRow={view.frozenRow} initialX={focus?.col ?? 0} />
              )}
            </div>
          </aside>
        )}
      </div>
      <SheetTabs
        sheets={sheets.map((s) => {
          const lock = team.protection.locks.find((l) => l.sheetId === s.id);
          return { id: s.id, name: s.name, lock: lock && lockSummary(lock) };
        })}
        activeId={activeSheetId}
        canEdit={!model.readOnly}
        onSelect={switchSheet}
        onAdd={async () => switchSheet(await addSheet(session))}
        onRename={(id, name) => renameSheet(session, id, name)}
        onMove={(id, position) => moveSheet(session, id, position)}
        onDelete={(id) => deleteSheet(session, id)}
        footer={
          <span className="flex items-center gap-2 px-2 text-ink-3">
            {view.data.length.toLocaleString('en')} rows
            <button type="button" className="rounded-ctl px-1.5 text-ink-2 hover:bg-hover hover:text-ink" onClick={() => model.addDisplayRows(activeSheetId, 1000)}>
              Add 1,000 rows
            </button>
          </span>
        }
      />
      {/* Once per workbook page, whatever panel is open: the grid itself presents computed results. */}
      <SafetyNote />
    </div>
  );
}
