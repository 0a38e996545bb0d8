// "View as of revision n": computed the way a restore computes its target, by undoing later
// revisions in memory (restore.ts), so what one sees is exactly what restoring n would bring back.
import type { RevisionSnapshot } from '../../shared/team.js';
import type { CellEntry } from '../../shared/workbooks.js';
import type { AppContext } from '../context.js';
import { notFound } from '../errors.js';
import { loadModel, undoLaterRevisions } from './restore.js';
import { currentRevision } from './revisionLog.js';

export function snapshotAt(ctx: AppContext, workbookId: string, n: number): RevisionSnapshot {
  return ctx.db.transaction((tx) => {
    if (n > currentRevision(tx, workbookId)) throw notFound(`revision ${n}`);
    const model = loadModel(tx, workbookId);
    undoLaterRevisions(tx, workbookId, model, n);
    return {
      revision: n,
      sheets: model.order.map((id, position) => {
        const s = model.sheets.get(id)!;
        const cells = [...s.cells].map(([key, input]): CellEntry => {
          const [row, col] = key.split(',').map(Number);
          return [row, col, input];
        });
        cells.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
        return { id, name: s.name, position, settings: s.settings, cells };
      }),
    };
  });
}
