// While an opened workbook still shows the values stored with its revision and its formulas are
// being put back into this page's engine: says so, and how far along it is. Gone once every cell
// is computed here (edits made meanwhile are saved as usual; what depends on them may lag until then).
import type { WorkbookModel } from '../../../core/workbook/model/workbookModel.js';

export function ComputingState({ model }: { model: WorkbookModel }) {
  const computing = model.computing;
  if (!computing) return null;
  const percent = computing.total === 0 ? 100 : Math.floor((100 * computing.done) / computing.total);
  return (
    <span
      role="status"
      aria-live="polite"
      data-testid="computing-state"
      data-done={computing.done}
      data-total={computing.total}
      title={
        model.computingFromStored
          ? `Showing the results saved with revision ${computing.revision} while formulas are computed in this tab; cells that depend on your newest edits catch up when it finishes.`
          : 'Formulas are being computed in this tab a part at a time, so the page stays responsive; formula cells not reached yet are empty for a moment.'
      }
      className="flex items-center gap-1.5 text-caption text-ink-2"
    >
      <span aria-hidden="true" className="size-2 animate-pulse rounded-full bg-current" />
      Computing here · {percent}%
    </span>
  );
}
