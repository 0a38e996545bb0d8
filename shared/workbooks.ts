// Workbooks, sheets, patches and revisions: the request bodies the server validates (and the client
// reuses) and the payloads the API returns. The routes that take and give them are in server/routes/.
import { z } from 'zod';
import type { AccessRole, SheetRole, SheetRoleSource, WorkbookAction } from './permissions.js';
import type { ProtectedRange, SheetLock, SheetRoles, TeamEvent } from './team.js';
import { cellInputProblem } from './cellInput.js';
import { cellKey, maxColIndex, maxRowIndex } from './a1.js';
import { sheetSettingsSchema, type SheetSettings } from './sheetSettings.js';

export { maxColIndex, maxRowIndex } from './a1.js';
/** One cell's input; longer text is almost certainly a paste gone wrong. */
export const maxInputLength = 32_768;
/**
 * The cells one request carries: a user action up to this size is one patch; a larger one goes as
 * the parts of one action (maxCellsPerAction), still one revision. A patch is applied synchronously,
 * so it bounds how long one request holds the event loop (target ≤ 250 ms): `npm run bench:big-patch`
 * measured 20,000 cells at ~170 ms (request ~200 ms) at load ~4.5 on the 2-core development machine.
 */
export const maxCellsPerPatch = 20_000;
/**
 * One user action larger than a patch is sent as parts of at most maxCellsPerPatch cells, held by the
 * server unapplied, and the last part applies them all as one revision (patchPartSchema). The
 * applying is one transaction, so this bounds how long it holds the event loop: `npm run
 * bench:big-patch` measured that last request at ~220 ms of CPU for 40,000 cells, ~245 ms for 45,000
 * and ~290 ms for 50,000 (load ~11 on the 2-core machine; see DEVELOPERS.md, "Large actions").
 * The grid refuses a larger action with a message saying so, rather than saving it as several revisions.
 */
export const maxCellsPerAction = 40_000;
/** Why the grid refuses an action of `cells` changed cells (over maxCellsPerAction). */
export const actionTooLargeReason = (cells: number) =>
  `this would change ${cells.toLocaleString('en-US')} cells, and one action may change at most ${maxCellsPerAction.toLocaleString('en-US')} (each action is saved as one revision, in one go); work on a smaller block.`;
/** How long the server holds the parts of an unfinished action after the last one arrived. */
export const stagedActionTtlMs = 60_000;
/**
 * The JSON body limit of the whole API (server/app.ts); a larger body is refused with 413. Room for
 * a patch of maxCellsPerPatch changes of ~200 bytes each (an id, a place and a formula).
 */
export const maxBodyBytes = 4 * 1024 * 1024;
export const maxSheetNameLength = 100;
export { maxSheetSettingsBytes, sheetSettingsSchema, type SheetSettings } from './sheetSettings.js';

const required = (kind: string) => (issue: { input: unknown }) => (issue.input === undefined ? 'required' : `must be ${kind}`);
const wholeNumber = () => z.int({ error: required('a whole number') });

export { workbookPath } from './workbookPath.js';

export const idSchema = z.string({ error: required('an id') }).regex(/^[A-Za-z0-9_-]{1,64}$/, 'not a valid id');

export const titleSchema = z
  .string({ error: required('text') })
  .trim()
  .min(1, 'required')
  .max(200, 'at most 200 characters')
  // A title goes into e-mail subjects and exports: a line break there could forge a header.
  // eslint-disable-next-line no-control-regex -- control characters are exactly what this refuses
  .refine((s) => !/[\u0000-\u001f\u007f]/.test(s), 'may not contain line breaks or other control characters');

/**
 * Sheet names follow the usual spreadsheet rules (common practice), so formulas can name them and
 * exports open elsewhere: no [ ] * ? / \ : characters, no quote at either end, no control characters.
 */
/**
 * The name a new tab gets until someone names it: Orbitab's own word for a page of candidates, a
 * screen. Written without a space, so formulas can name it unquoted (=Screen2!B4).
 */
export function defaultSheetName(n: number): string {
  return `Screen${n}`;
}

export const sheetNameSchema = z
  .string({ error: required('text') })
  .trim()
  .min(1, 'required')
  .max(maxSheetNameLength, `at most ${maxSheetNameLength} characters`)
  .refine((s) => !/[[\]*?/\\:]/.test(s), 'may not contain any of [ ] * ? / \\ :')
  .refine((s) => !s.startsWith("'") && !s.endsWith("'"), 'may not begin or end with an apostrophe')
  // eslint-disable-next-line no-control-regex -- control characters are exactly what this refuses
  .refine((s) => !/[\u0000-\u001f\u007f]/.test(s), 'may not contain control characters');

export const createWorkbookSchema = z.object({ title: titleSchema });
export type CreateWorkbookInput = z.infer<typeof createWorkbookSchema>;

export const renameWorkbookSchema = z.object({ title: titleSchema });
export type RenameWorkbookInput = z.infer<typeof renameWorkbookSchema>;

/** A new sheet: without a name it is called "Sheet<n>"; without a position it goes last. */
export const createSheetSchema = z.object({
  name: sheetNameSchema.optional(),
  position: wholeNumber().min(0, 'must be 0 or more').optional(),
});
export type CreateSheetInput = z.infer<typeof createSheetSchema>;

/** Rename, move (position counts from 0, the first tab) and/or change display settings. */
export const updateSheetSchema = z
  .object({
    name: sheetNameSchema.optional(),
    position: wholeNumber().min(0, 'must be 0 or more').optional(),
    settings: sheetSettingsSchema.optional(),
  })
  .refine((b) => b.name !== undefined || b.position !== undefined || b.settings !== undefined, 'give at least one of name, position, settings');
export type UpdateSheetInput = z.infer<typeof updateSheetSchema>;

export const cellChangeSchema = z.object({
  sheetId: idSchema,
  row: wholeNumber().min(0, 'must be 0 or more').max(maxRowIndex, `must be at most ${maxRowIndex} (the last row)`),
  col: wholeNumber().min(0, 'must be 0 or more').max(maxColIndex, `must be at most ${maxColIndex} (the last column)`),
  /** What the user typed: a value or a formula. '' clears the cell. */
  input: z
    .string({ error: required('text') })
    .max(maxInputLength, `at most ${maxInputLength} characters`)
    .superRefine((input, ctx) => {
      const problem = cellInputProblem(input);
      if (problem) ctx.addIssue({ code: 'custom', message: problem });
    }),
});
export type CellChange = z.infer<typeof cellChangeSchema>;

/** A patch of at most `limit` cells; the API takes patchSchema (benchmarks try larger limits). */
export const patchSchemaUpTo = (limit: number) =>
  z
    .object({
      /** The workbook revision the client's view was based on; cells changed after it are conflicts. */
      baseRevision: wholeNumber().min(0, 'must be 0 or more'),
      changes: z
        .array(cellChangeSchema, { error: required('a list of changes') })
        .min(1, 'must hold at least one change')
        .max(limit, `a patch may change at most ${limit} cells; send the rest in another patch`),
    })
    .superRefine((patch, ctx) => {
      // Two inputs for one cell in one patch would make the result depend on order: refuse it.
      const seen = new Map<string, number>();
      patch.changes.forEach((c, i) => {
        const key = cellKey(c);
        const first = seen.get(key);
        if (first !== undefined) ctx.addIssue({ code: 'custom', path: ['changes', i], message: `the same cell as changes.${first}; send one input per cell` });
        else seen.set(key, i);
      });
    });
export const patchSchema = patchSchemaUpTo(maxCellsPerPatch);
export type PatchInput = z.infer<typeof patchSchema>;

/**
 * `part` of a patch body: this patch is part `index` (from 0) of `count` parts of one action. Every
 * part carries the same baseRevision; the parts are sent in order, one at a time.
 */
export const maxPartsPerAction = 500;
export const patchPartSchema = z.object({
  actionId: idSchema,
  index: wholeNumber().min(0, 'must be 0 or more'),
  count: wholeNumber()
    .min(2, 'must be 2 or more (a one-part action is a plain patch)')
    .max(maxPartsPerAction, `must be at most ${maxPartsPerAction}`),
}).refine((p) => p.index < p.count, { path: ['index'], message: 'must be less than count' });
export type PatchPart = z.infer<typeof patchPartSchema>;

/** The cells the last part of an action carries at most: its request applies the whole action, so it parses and reads little. */
export const lastPartCells = 1_000;

/**
 * How an action of `total` cells is cut into parts of at most `size` cells: one part when it fits,
 * else full parts and a short last one (lastPartCells), whose request does the applying.
 */
export function actionPartSizes(total: number, size: number): number[] {
  if (total <= size) return [total];
  const tail = Math.min(lastPartCells, size, total - 1);
  const head = total - tail;
  const sizes = Array.from({ length: Math.ceil(head / size) }, (_, i) => Math.min(size, head - i * size));
  return [...sizes, tail];
}
export const patchPartBodySchema = z.object({ part: patchPartSchema.optional() });

export const revisionListQuerySchema = z.object({
  /** Only revisions numbered below this (paging backwards). */
  before: z.coerce.number().int('must be a whole number').min(1, 'must be 1 or more').optional(),
  limit: z.coerce.number().int('must be a whole number').min(1, 'must be 1 or more').max(500, 'at most 500').default(100),
});

// ---- payloads ----

/** One non-empty cell: [row, col, input], rows and columns counted from 0. */
export type CellEntry = [row: number, col: number, input: string];

export interface SheetPayload {
  id: string;
  name: string;
  position: number;
  settings: SheetSettings;
  /** The sheet's non-empty cells in reading order (row, then column); the page's preview relies on it. */
  cells: CellEntry[];
  /** Who added the sheet (in the workbook load): editors manage roles only on sheets they created. */
  createdBy?: string | null;
}

export interface WorkbookSummary {
  id: string;
  title: string;
  revision: number;
  role: AccessRole;
  /** What the user may do with all their roles together (shared/permissions.ts allowedActions). */
  actions: WorkbookAction[];
  owner: { id: string; name: string };
  createdAt: number;
  updatedAt: number;
}

/** GET /api/workbooks/:id — everything the client needs to build its engine. */
export interface WorkbookPayload {
  id: string;
  title: string;
  revision: number;
  role: AccessRole;
  /** What the user may do with all their roles together (shared/permissions.ts allowedActions). */
  actions: WorkbookAction[];
  sheets: SheetPayload[];
  /** Sheet locks and protected ranges (shared/team.ts); the server always sends both lists. */
  locks?: SheetLock[];
  sheetRoles?: SheetRoles[];
  protectedRanges?: ProtectedRange[];
  /** The signed-in user's effective role on each sheet, in tab order, and why (shared/permissions.ts). */
  mySheetRoles?: { sheetId: string; role: SheetRole; source: SheetRoleSource }[];
}

export interface SheetMutationResult {
  revision: number;
  sheet: Omit<SheetPayload, 'cells'>;
}

export interface PatchResult {
  /** The workbook revision after the patch (unchanged when every change matched what was stored). */
  revision: number;
  /** How many cells actually changed. */
  applied: number;
}

/** The answer to a part of an action other than the last: held, not applied. */
export interface PatchPartResult {
  staged: { actionId: string; received: number; count: number; cells: number };
}

/** One refused cell of a 409: what is stored now and which revision wrote it. */
export interface CellConflict {
  sheetId: string;
  row: number;
  col: number;
  /** The input stored now ('' when someone cleared it). */
  theirs: string;
  /** The input this patch wanted. */
  mine: string;
  /** The revision that last wrote the cell. */
  revision: number;
}
export interface ConflictDetails {
  conflicts: CellConflict[];
}

// ---- revisions ----

export type RevisionKind = 'edit' | 'sheet' | 'restore' | 'import';

export interface CellChangeRecord {
  sheetId: string;
  row: number;
  col: number;
  before: string;
  after: string;
}

/**
 * A change to the tabs, recorded so that it can be undone exactly: 'add' and 'delete' carry the
 * sheet's cells, positions count from 0 and stay dense.
 */
export type SheetOp =
  | { op: 'add'; sheetId: string; name: string; position: number; settings: SheetSettings; cells: CellEntry[] }
  | { op: 'delete'; sheetId: string; name: string; position: number; settings: SheetSettings; cells: CellEntry[] }
  | { op: 'rename'; sheetId: string; before: string; after: string }
  | { op: 'move'; sheetId: string; from: number; to: number }
  | { op: 'settings'; sheetId: string; before: SheetSettings; after: SheetSettings };

/** What a revision did: first the sheet operations in order, then the cell changes. */
export interface RevisionPatch {
  sheetOps: SheetOp[];
  changes: CellChangeRecord[];
  /** For a restore: the revision whose state it brought back. */
  restoredFrom?: number;
  /** For a restore of one sheet: that sheet (the others were left as they were). */
  restoredSheetId?: string;
}

export interface RevisionSummary {
  number: number;
  kind: RevisionKind;
  author: { id: string; name: string; email: string } | null;
  /** Milliseconds since the epoch. */
  createdAt: number;
  /** Cell changes plus sheet operations. */
  changeCount: number;
  /** What the revision did, for the change log: its first few cell changes and tab operations. */
  preview: RevisionPreview;
}

/** The first cell changes and tab operations of a revision (the rest are counted, not listed). */
export interface RevisionPreview {
  cells: CellChangeRecord[];
  cellCount: number;
  sheetOps: SheetOpPreview[];
  sheetOpCount: number;
  restoredFrom?: number;
  restoredSheetId?: string;
}

/** A tab operation without the cells an add or delete carries. */
export type SheetOpPreview =
  | { op: 'add' | 'delete'; sheetId: string; name: string }
  | { op: 'rename'; sheetId: string; before: string; after: string }
  | { op: 'move'; sheetId: string; from: number; to: number }
  | { op: 'settings'; sheetId: string; before: SheetSettings; after: SheetSettings };

/** POST /api/workbooks/:id/revisions/:n/restore — the whole workbook, or one sheet of it. */
export const restoreBodySchema = z
  .object({ sheetId: z.string('must be a sheet id').min(1, 'must be a sheet id').max(64, 'must be a sheet id').optional() })
  .strict();

export interface RevisionDetail extends RevisionSummary {
  patch: RevisionPatch;
}

// ---- computed values ----

export type ComputedValue = number | string | boolean | { error: string; message: string };
export type ValueEntry = [row: number, col: number, value: ComputedValue];

/** GET /api/workbooks/:id/values — every non-empty computed value, per sheet. */
export interface ValuesPayload {
  revision: number;
  /** Each sheet's values in reading order (row, then column), as its cells are. */
  sheets: { id: string; name: string; values: ValueEntry[] }[];
}

export { firstColsShown, firstRowsShown } from './firstRows.js';

/**
 * GET /api/workbooks/:id/first-rows — what the page paints while the whole workbook and its values are
 * still on their way: the first tab's first rows and columns (`firstRowsShown` × `firstColsShown`) and the values stored with the
 * current revision for them (null while they are not stored, or when a formula calls a function of
 * the clock or of chance). A few kilobytes however large the workbook.
 */
export interface FirstRowsPayload {
  id: string;
  title: string;
  revision: number;
  /** The first tab, with only its cells in those rows and columns; null for a workbook without tabs. */
  sheet: SheetPayload | null;
  values: ValueEntry[] | null;
  /** The workbook's non-empty cells at this revision, when its values are stored (else null). */
  cells: number | null;
}

/**
 * Kept beside a revision's stored /values answer: what an export needs to write the same file as a
 * fresh computation. Per sheet id; each list is of cells, in row-major order.
 */
export interface StoredValueExtras {
  /** The catalog functions the formulas call, with how many cells call each (an export's front sheet). */
  functionsUsed?: { name: string; family: string; source: string; cells: number }[];
  sheets: Record<
    string,
    {
      /** Numbers the engine marked as a date, a time or both. */
      dates?: [row: number, col: number, kind: 'date' | 'time' | 'datetime'][];
      /** Array formulas' anchors and the area they spilled into. */
      spills?: [row: number, col: number, rows: number, cols: number][];
      /** Cells whose value is the empty text ('' is left out of /values, as empty cells are). */
      emptyTexts?: [row: number, col: number][];
      /** Errors the engine gave no message of its own (/values words them; files keep no note). */
      bareErrors?: [row: number, col: number][];
    }
  >;
}

// ---- live updates (published in-process; the live-updates issue sends them over SSE) ----

export type WorkbookEvent =
  | { type: 'revision'; workbookId: string; revision: number; kind: RevisionKind; authorId: string; patch: RevisionPatch }
  | { type: 'renamed'; workbookId: string; title: string }
  | { type: 'deleted'; workbookId: string }
  | TeamEvent;
