// The open workbook: title and save state, toolbar, formula bar, the sheet, the side panel and the
// sheet tabs. Holds the view state (active sheet, selection, filter, live column widths); the data
// lives in the model.
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { DataSheetGridRef } from 'react-datasheet-grid';
import { SafetyNote } from '../../features/diagram/SafetyNote.js';
import { cellName } from '@shared/a1.js';
import { goToTarget } from '../../features/grid/goToAddress.js';
import { readChartSpec } from '@shared/chartSpec.js';
import { fillPairs } from '../../core/workbook/model/rangeEdits.js';
import { revealBesideRowNumbers } from '../../features/grid/revealCell.js';
import { FilterMenu, type SheetFilter } from '../../features/grid/components/FilterMenu.js';
import { FormulaBar, type FormulaBarHandle } from '../../features/grid/components/FormulaBar.js';
import { SheetGrid, type ViewCell } from '../../features/grid/components/SheetGrid.js';
import { SheetTabs } from '../../features/grid/components/SheetTabs.js';
import { StarterTemplate } from '../../features/grid/StarterTemplate.js';
import { Toolbar } from '../../features/grid/components/Toolbar.js';
import { useSheetKeys } from '../../features/grid/components/useSheetKeys.js';
import { addSheet, deleteSheet, moveSheet, renameSheet } from '../../core/workbook/api.js';
import { useModelVersion, useSaveStatus, type WorkbookSession } from '../../core/workbook/session/useWorkbookSession.js';
import { StructureProgress } from '../../features/structures/StructureProgress.js';
import { useSheetCommands, type Notice, type ViewSelection } from '../../features/grid/useSheetCommands.js';
import { useSheetView } from '../../features/grid/useSheetView.js';
import { ConflictResolver } from '../../features/live/ConflictResolver.js';
import { lockSummary } from '../../features/locks/SheetLockSection.js';
import { TeamNotices } from './TeamNotices.js';
import { GridMenu } from './GridMenu.js';
import { SidePanel } from './SidePanel.js';
import { useDisplaySaver } from './useDisplaySaver.js';
import { useFocusedCell } from './useFocusedCell.js';
import { usePanelWidth } from './usePanelWidth.js';
import { MessageStrip, WorkbookBar } from './WorkbookBar.js';
import { useWorkbookTeam } from '../../features/live/useWorkbookTeam.js';
import { ImportButton } from '../../features/io/index.js';
import { sheetViewOnlyReason } from '../../core/team/editability.js';
import { allows } from '@shared/permissions.js';
import { presenceColour } from '../../lib/presenceColours.js';

function gridSelection(grid: DataSheetGridRef | null): ViewSelection | null {
  const s = grid?.selection;
  return s ? { min: { row: s.min.row, col: s.min.col }, max: { row: s.max.row, col: s.max.col } } : null;
}

export function Workspace({ session }: { session: WorkbookSession }) {
  const { model, queue, store } = session;
  const modelVersion = useModelVersion(model);
  const status = useSaveStatus(queue);
  const sheets = model.sheets;
  const [sheetId, setSheetId] = useState(sheets[0]?.id ?? '');
  const activeSheetId = model.hasSheet(sheetId) ? sheetId : (sheets[0]?.id ?? '');
  const sheet = model.sheet(activeSheetId);
  /** How many view rows and columns the grid shows (pointing and jumps stop at its edges). */
  const extent = () => ({ rows: view.data.length, cols: sheet.colCount });
  const display = sheet.display;

  const [filters, setFilters] = useState<Record<string, SheetFilter | null>>({});
  const filter = filters[activeSheetId] ?? null;
  const [dragWidths, setDragWidths] = useState<Record<number, number>>({});
  const [active, setActive] = useState<ViewCell | null>(null);
  const [selection, setSelection] = useState<ViewSelection | null>(null);
  const [frozenPick, setFrozenPick] = useState<number | null>(null);
  const [liveText, setLiveText] = useState<string | null>(null);
  const [panel, setPanel] = useState<'structure' | 'chart' | null>('structure');
  const [message, setMessage] = useState<Notice>(session.restored > 0 ? `${session.restored} unsent change${session.restored === 1 ? '' : 's'} from your last visit restored; sending now.` : null);
  const editing = useRef(false);
  const gridRef = useRef<DataSheetGridRef>(null);
  const barRef = useRef<FormulaBarHandle>(null);
  const view = useSheetView(model, activeSheetId, display.freezeHeaderRow, filter);

  // A sheet I only view keeps my Decimals, Freeze and widths on this screen, unsaved and without complaint.
  const viewOnlyHere = useRef<string | null>(null);
  const keepDisplayLocal = useCallback(() => viewOnlyHere.current !== null, []);
  const setDisplay = useDisplaySaver(session, activeSheetId, setMessage, keepDisplayLocal);

  // Sheets added from a file arrive over the live stream; the first one is shown once it is here.
  const [importedSheet, setImportedSheet] = useState<string | null>(null);
  useEffect(() => {
    if (importedSheet && model.hasSheet(importedSheet)) {
      setImportedSheet(null);
      switchSheet(importedSheet);
    }
  }, [importedSheet, model, modelVersion]);

  const switchSheet = (id: string) => {
    setSheetId(id);
    setActive(null);
    setSelection(null);
    setFrozenPick(null);
    gridRef.current?.setActiveCell(null);
  };

  const { focus, focusView, focusInput, address, structureSource } = useFocusedCell(model, activeSheetId, view, { active, selection, frozenPick });

  // Colleagues: live revisions, presence (my cursor), locks and protected ranges as the grid's edit rule.
  const team = useWorkbookTeam(session, focus ? { sheetId: activeSheetId, row: focus.row, col: focus.col } : null);
  // Why this sheet is view-only for me (my workbook role, a sheet role or a lock), or null.
  const sheetViewOnly = model.readOnly ? (sheetViewOnlyReason(team.protection, team.me, activeSheetId) ?? 'View only — you view this workbook.') : sheetViewOnlyReason(team.protection, team.me, activeSheetId);
  viewOnlyHere.current = sheetViewOnly;
  const tabRefusal = (id: string) =>
    allows(team.actions, 'editSheets') ? sheetViewOnlyReason(team.protection, team.me, id) : 'View only — adding, renaming, moving and deleting sheets needs the editor role in this workbook.';

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
    extent,
    lastUsed: () => {
      const { rows, cols } = sheet.inputs.extent();
      let row = view.data.length - 1;
      while (row > 0 && view.sheetRow(row) > rows - 1) row--;
      return { row, col: Math.max(0, cols - 1) };
    },
    lastUsedColInRow: (r) => Math.max(0, ...Object.keys(view.data[r] ?? {}).map(Number)),
    isFilled: (r, c) => (view.data[r]?.[c]?.display ?? '') !== '',
    frozenCol: () => frozenPick,
    hasFrozenRow: () => display.freezeHeaderRow,
    readOnlyHere: () => (focus ? model.readOnlyReason(activeSheetId, focus.row, focus.col) : null),
    onRefusedTyping: (reason) => setMessage(reason),
    pickFrozen: (col) => {
      if (col === null) {
        gridRef.current?.setActiveCell({ row: 0, col: frozenPick ?? 0 });
        setFrozenPick(null);
      } else {
        gridRef.current?.setActiveCell(null);
        setFrozenPick(col);
      }
    },
    editInBar: (typed) => barRef.current?.edit(typed),
    pageRows: () => Math.max(1, Math.floor((document.querySelector('[data-testid="sheet-grid"]')?.clientHeight ?? 480) / 24) - 2),
    ...commands,
  });

  const widths = useMemo(() => ({ ...display.columnWidths, ...dragWidths }), [display.columnWidths, dragWidths]);
  const gridRow = useRef<HTMLDivElement>(null);
  const panelWidth = usePanelWidth(gridRow, panel !== null, sheet.colCount, widths);
  useEffect(() => setDragWidths({}), [display.columnWidths]);
  // Leaving the formula bar: back to the cell in the grid; on the frozen header row, Enter moves
  // down into the grid (as it would from any cell) and Escape stays on the header cell.
  const returnToGrid = (committed = false) => {
    if (frozenPick !== null) {
      (document.activeElement as HTMLElement | null)?.blur();
      if (committed) {
        gridRef.current?.setActiveCell({ row: 0, col: frozenPick });
        setFrozenPick(null);
      }
    } else if (active) {
      // A block selected from its top-left corner (as the address box selects one) stays selected.
      const block = selection && (selection.min.row !== selection.max.row || selection.min.col !== selection.max.col) ? selection : null;
      if (!committed && block && block.min.row === active.row && block.min.col === active.col) gridRef.current?.setSelection(block);
      else gridRef.current?.setActiveCell(active);
    }
  };

  return (
    <div className="flex h-full min-h-0 flex-col bg-canvas">
      <WorkbookBar model={model} team={team} activeSheet={{ id: activeSheetId, name: sheet.name }} selectionRange={address || undefined} status={status} storageWorks={store.storageWorks} />
      <ConflictResolver session={session} status={status} onSetAside={team.addSetAside} />
      <StructureProgress store={session.structures} />
      <Toolbar
        canEdit={!model.readOnly && sheetViewOnly === null}
        viewOnlyReason={sheetViewOnly}
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
        barRef={barRef}
        refFor={(viewRow, col) => cellName(view.sheetRow(viewRow), col)}
        pointFrom={active ? { viewRow: active.row, col: active.col } : null}
        extent={extent}
        address={address}
        input={focusInput}
        liveText={liveText}
        view={focusView}
        readOnlyReason={focus ? model.readOnlyReason(activeSheetId, focus.row, focus.col) : null}
        disabled={!focus || model.readOnly}
        onCommit={(input) => {
          if (!focus) return;
          const outcome = model.edit([{ sheetId: activeSheetId, row: focus.row, col: focus.col, input }]);
          setMessage(outcome.refused[0] ? `${outcome.refused[0].reason} Nothing was changed.` : null);
          returnToGrid(true);
        }}
        onCancel={() => returnToGrid()}
        onGoTo={(text) => {
          const target = goToTarget(text, { viewRowOf: view.viewRowOf, frozenHeader: display.freezeHeaderRow });
          if (target.kind === 'none') {
            setMessage(target.reason);
            return false;
          }
          setMessage(null);
          if (target.kind === 'frozen') {
            gridRef.current?.setActiveCell(null);
            setFrozenPick(target.col);
            return true;
          }
          if (target.kind === 'cell') gridRef.current?.setActiveCell({ row: target.row, col: target.col });
          else gridRef.current?.setSelection({ min: target.min, max: target.max });
          revealBesideRowNumbers(target.kind === 'cell' ? target.col : target.min.col, widths);
          return true;
        }}
      />
      <MessageStrip message={message} onDismiss={() => setMessage(null)} />
      <TeamNotices team={team} model={model} activeSheetId={activeSheetId} />
      <StarterTemplate model={model} sheetId={activeSheetId} />
      <div className="flex min-h-0 flex-1" ref={gridRow}>
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
            presence={team.live.presence.flatMap((u) => {
              if (u.userId === team.myId || !u.cell || u.cell.sheetId !== activeSheetId) return [];
              const row = view.viewRowOf(u.cell.row);
              return row === null ? [] : [{ userId: u.userId, name: u.name, colour: presenceColour(u.userId), row, col: u.cell.col, address: cellName(u.cell.row, u.cell.col) }];
            })}
            onCells={(changes, fills) => {
              // Typed and drag-filled cells of one gesture are one undo step.
              const [a, b] = model.history.action(() => [model.edit(changes), fillPairs(model, activeSheetId, fills)]);
              const refused = [...a.refused, ...b.refused];
              setMessage(refused.length ? `${refused[0].reason} ${refused.length} cell${refused.length === 1 ? '' : 's'} left as they were.` : null);
            }}
          />
        </div>
        {panel && (
          <SidePanel
            panel={panel}
            structureSource={structureSource}
            address={address}
            view={view}
            colCount={sheet.colCount}
            filtered={filter !== null}
            sheetName={sheet.name}
            chart={readChartSpec(display.kept)}
            // Kept with the sheet's other settings: saved with the workbook, back on the next open.
            onChart={(chart) => setDisplay({ ...display, kept: { ...display.kept, chart } })}
            initialX={focus?.col ?? 0}
            widthPx={panelWidth}
            key={activeSheetId}
          />
        )}
      </div>
      <SheetTabs
        sheets={sheets.map((s) => {
          const lock = team.protection.locks.find((l) => l.sheetId === s.id);
          return { id: s.id, name: s.name, lock: lock && lockSummary(lock, team.myId), viewOnly: sheetViewOnlyReason(team.protection, team.me, s.id) ?? undefined, refusal: tabRefusal(s.id) ?? undefined };
        })}
        activeId={activeSheetId}
        canEdit={allows(team.actions, 'editSheets')}
        onSelect={switchSheet}
        onAdd={async () => switchSheet(await addSheet(session))}
        onRename={(id, name) => renameSheet(session, id, name)}
        onMove={(id, position) => moveSheet(session, id, position)}
        onDelete={(id) => deleteSheet(session, id)}
        footer={
          <span className="flex items-center gap-2 px-2 text-ink-3">
            <ImportButton
              workbookId={model.id}
              label="Sheets from a file…"
              variant="ghost"
              className="h-6 px-1.5 text-caption"
              disabled={!allows(team.actions, 'editSheets')}
              title="Add the sheets of an .xlsx or .csv file (or a structure file) to this workbook"
              onImported={(result) => setImportedSheet(result.sheets[0]?.id ?? null)}
            />
            {view.data.length.toLocaleString('en')} rows
            <button type="button" className="rounded-ctl px-1.5 text-ink-2 hover:bg-hover hover:text-ink" onClick={() => model.addDisplayRows(activeSheetId, 1000)}>
              Add 1,000 rows
            </button>
          </span>
        }
      />
      <GridMenu
        gridRef={gridRef}
        commands={commands}
        extent={extent}
        editBlocked={model.readOnly ? 'You can view this workbook but not edit it' : null}
        structureBlocked={model.structureRule?.(activeSheetId) ?? null}
        canUndo={model.history.canUndo}
        canRedo={model.history.canRedo}
        say={setMessage}
      />
      {/* Once per workbook page, whatever panel is open: the grid itself presents computed results. */}
      <SafetyNote />
    </div>
  );
}
