// The bar above the grid: the workbook's title, the team's controls, export and the save state.
import type { WorkbookModel } from '../../core/workbook/model/workbookModel.js';
import type { SaveStatus } from '../../core/workbook/save/patchQueue.js';
import { SaveIndicator } from '../../features/grid/components/SaveIndicator.js';
import { ExportMenu } from '../../features/io/index.js';
import type { WorkbookTeam } from '../../features/live/useWorkbookTeam.js';
import { TeamToolbar } from './TeamToolbar.js';
import type { Notice } from '../../features/grid/useSheetCommands.js';

export function WorkbookBar(p: { model: WorkbookModel; team: WorkbookTeam; activeSheet: { id: string; name: string }; selectionRange?: string; status: SaveStatus; storageWorks: boolean }) {
  return (
    <div className="flex h-9 shrink-0 items-center gap-3 border-b border-line bg-surface px-3" data-grid-shield="">
      <h1 className="truncate text-ui font-semibold" data-testid="workbook-title">
        {p.model.title}
      </h1>
      {p.model.readOnly && <span className="rounded-ctl bg-raised px-1.5 text-caption text-ink-3">read-only</span>}
      <span className="ml-auto" />
      <TeamToolbar team={p.team} model={p.model} activeSheet={p.activeSheet} selectionRange={p.selectionRange} />
      {/* Every role may export, viewers included (the API checks the same). */}
      <ExportMenu workbookId={p.model.id} activeSheet={p.activeSheet} />
      <SaveIndicator status={p.status} storageWorks={p.storageWorks} />
    </div>
  );
}

/** One line of feedback under the formula bar (a refusal, a restore), dismissible, with one action at most. */
export function MessageStrip({ message, onDismiss }: { message: Notice; onDismiss: () => void }) {
  if (!message) return null;
  const text = typeof message === 'string' ? message : message.text;
  const action = typeof message === 'string' ? null : message.action;
  return (
    // Clicks here keep the grid's active cell (the grid treats a click outside it as leaving it).
    <div role="status" data-grid-shield="" onMouseDown={(e) => e.stopPropagation()} className="flex shrink-0 items-center gap-2 border-b border-caution-line bg-caution-soft px-3 py-1 text-caption text-ink" data-testid="sheet-message">
      {text}
      {action && (
        <button
          type="button"
          className="rounded-ctl border border-caution-line bg-surface px-2 py-0.5 font-medium text-ink hover:bg-hover"
          onMouseDown={(e) => e.preventDefault()}
          onClick={() => {
            onDismiss();
            action.run();
          }}
        >
          {action.label}
        </button>
      )}
      <button type="button" className="ml-auto text-ink-3 hover:text-ink" aria-label="Dismiss" onClick={onDismiss}>
        ×
      </button>
    </div>
  );
}
