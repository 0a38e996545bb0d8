// Gathers what an export needs from the database: the workbook's sheets and cells (one consistent
// snapshot), their locks, sheet roles and protected ranges with people's names, and who is exporting.
import type { User } from 'lucia';
import type { AppContext } from '../context.js';
import type { WorkbookAccess } from '../services/access.js';
import { loadProtection } from '../services/protection.js';
import { loadWorkbookInSlices } from '../services/workbookSlices.js';
import type { ExportWorkbook } from './types.js';

export async function exportSource(ctx: AppContext, access: WorkbookAccess, user: Pick<User, 'name' | 'email'>, now = new Date()): Promise<ExportWorkbook & { sheetIds: string[] }> {
  // Read a page at a time (workbookSlices.ts): a large workbook's cells never hold the event loop long.
  const workbook = await loadWorkbookInSlices(ctx, access);
  const protection = loadProtection(ctx.db, workbook.id);
  return {
    title: workbook.title,
    revision: workbook.revision,
    exportedBy: `${user.name} <${user.email}>`,
    exportedAt: now,
    sheetIds: workbook.sheets.map((s) => s.id),
    sheets: workbook.sheets.map((s) => {
      const lock = protection.locks.find((l) => l.sheetId === s.id);
      const set = (protection.sheetRoles.find((r) => r.sheetId === s.id)?.overrides ?? []).filter((o) => !o.viaLock);
      const namesWith = (role: string) => set.filter((o) => o.role === role).map((o) => o.user.name);
      return {
        name: s.name,
        cells: s.cells,
        settings: s.settings,
        lock: lock ? { lockedByName: lock.lockedBy.name, reason: lock.reason, editorNames: lock.editors.map((e) => e.name) } : null,
        sheetRoles: set.length ? { editorNames: namesWith('editor'), viewerNames: namesWith('viewer') } : null,
        protectedRanges: protection.protectedRanges.filter((r) => r.sheetId === s.id).map((r) => ({ range: r.range, editorNames: r.editors.map((e) => e.name) })),
      };
    }),
  };
}
