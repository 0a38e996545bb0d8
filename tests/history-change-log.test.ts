// The words of the change log: "1 change", before → after for the first cells and "and N more",
// tab operations in a sentence, and runs of display-only changes folded into one entry.
import { describe, expect, it } from 'vitest';
import type { RevisionPreview, RevisionSummary } from '../shared/workbooks.js';
import { describeAudit } from '../src/features/audit/describeAudit.js';
import { cellLines, changeCountText, displayRunText, entryHeadline, groupLog, isDisplayOnly, touchedSheets } from '../src/features/history/changeLog.js';

const names: Record<string, string> = { s1: 'Screen', s2: 'Notes' };
const nameOf = (id: string) => names[id] ?? null;
const ann = { id: 'u-ann', name: 'Ann', email: 'ann@lab.test' };
const ben = { id: 'u-ben', name: 'Ben', email: 'ben@lab.test' };
const empty: RevisionPreview = { cells: [], cellCount: 0, sheetOps: [], sheetOpCount: 0 };
let n = 0;
const rev = (preview: Partial<RevisionPreview>, kind: RevisionSummary['kind'] = 'edit', author = ann): RevisionSummary => ({
  number: ++n,
  kind,
  author,
  createdAt: 0,
  changeCount: (preview.cellCount ?? 0) + (preview.sheetOpCount ?? 0),
  preview: { ...empty, ...preview },
});
const settings = (before: object, after: object, sheetId = 's1') => rev({ sheetOps: [{ op: 'settings', sheetId, before: before as never, after: after as never }], sheetOpCount: 1 });

describe('counts', () => {
  it('says "1 change" and "30 changes"', () => {
    expect(changeCountText(1)).toBe('1 change');
    expect(changeCountText(30)).toBe('30 changes');
    expect(changeCountText(1200)).toBe('1,200 changes');
  });
});

describe('an entry of cell edits', () => {
  const cells = [
    { sheetId: 's1', row: 1, col: 0, before: 'O2', after: 'NO' },
    { sheetId: 's1', row: 1, col: 1, before: '', after: '=BONDORDER(A2)' },
  ];

  it('lists each cell with before → after, blanks in words', () => {
    const { lines, more } = cellLines({ ...empty, cells, cellCount: 2 }, nameOf);
    expect(lines).toEqual([
      { where: 'A2', before: 'O2', after: 'NO' },
      { where: 'B2', before: '(empty)', after: '=BONDORDER(A2)' },
    ]);
    expect(more).toBe('');
  });

  it('counts the cells not listed: "and 28 more"', () => {
    expect(cellLines({ ...empty, cells, cellCount: 30 }, nameOf).more).toBe('and 28 more');
  });

  it('names the sheet when an entry touches two', () => {
    const two = [...cells, { sheetId: 's2', row: 0, col: 0, before: 'x', after: 'y' }];
    expect(cellLines({ ...empty, cells: two, cellCount: 3 }, nameOf).lines.map((l) => l.where)).toEqual(['Screen!A2', 'Screen!B2', 'Notes!A1']);
  });

  it('has a headline in words', () => {
    expect(entryHeadline(rev({ cells: cells.slice(0, 1), cellCount: 1 }), nameOf)).toBe('Edited 1 cell');
    expect(entryHeadline(rev({ cells, cellCount: 30 }), nameOf)).toBe('Edited 30 cells');
  });
});

describe('other entries', () => {
  it('tells tab operations, restores and imports in a sentence', () => {
    expect(entryHeadline(rev({ sheetOps: [{ op: 'rename', sheetId: 's1', before: 'Sheet 1', after: 'Screen' }], sheetOpCount: 1 }, 'sheet'), nameOf)).toBe('Renamed sheet “Sheet 1” to “Screen”');
    expect(entryHeadline(rev({ sheetOps: [{ op: 'delete', sheetId: 's9', name: 'Old' }], sheetOpCount: 1 }, 'sheet'), nameOf)).toBe('Removed sheet “Old”');
    expect(entryHeadline(rev({ restoredFrom: 4, restoredSheetId: 's2', cellCount: 1 }, 'restore'), nameOf)).toBe('Brought back sheet “Notes” as it was after #4');
    expect(entryHeadline(rev({ restoredFrom: 4 }, 'restore'), nameOf)).toBe('Brought back the workbook as it was after #4');
    expect(entryHeadline(rev({ cellCount: 120, sheetOpCount: 1, sheetOps: [{ op: 'add', sheetId: 's3', name: 'Data' }] }, 'import'), nameOf)).toBe('Imported 120 cells on a new sheet');
    expect(entryHeadline(settings({ precision: 3 }, { precision: 4, freezeHeaderRow: true }), nameOf)).toBe('Display of “Screen”: decimals 3 → 4, row 1 frozen');
  });

  it('knows which sheets an entry touched', () => {
    expect(touchedSheets({ ...empty, cells: [{ sheetId: 's2', row: 0, col: 0, before: '', after: '1' }], sheetOps: [{ op: 'rename', sheetId: 's1', before: 'a', after: 'b' }] })).toEqual(['s2', 's1']);
  });
});

describe('display-only changes', () => {
  it('are told apart from changes to what formulas read', () => {
    expect(isDisplayOnly(settings({}, { precision: 2 }))).toBe(true);
    expect(isDisplayOnly(rev({ cells: [{ sheetId: 's1', row: 0, col: 0, before: '', after: '1' }], cellCount: 1 }))).toBe(false);
    expect(isDisplayOnly(rev({ sheetOps: [{ op: 'rename', sheetId: 's1', before: 'a', after: 'b' }], sheetOpCount: 1 }))).toBe(false);
  });

  it('fold into one entry per person and run, told as the net change', () => {
    // Newest first, as listed: Ben's edit, then four display changes by Ann, then Ann's edit.
    const edit1 = rev({ cells: [{ sheetId: 's1', row: 0, col: 0, before: '', after: 'O2' }], cellCount: 1 });
    const d1 = settings({ precision: null }, { precision: 3 });
    const d2 = settings({ precision: 3 }, { precision: 4 });
    const d3 = settings({ precision: 4 }, { precision: 4, freezeHeaderRow: true });
    const d4 = settings({ precision: 4, freezeHeaderRow: true }, { precision: 5, freezeHeaderRow: true });
    const edit2 = rev({ cells: [{ sheetId: 's1', row: 0, col: 0, before: 'O2', after: 'NO' }], cellCount: 1 }, 'edit', ben);
    const log = groupLog([edit2, d4, d3, d2, d1, edit1]);
    expect(log.map((e) => (e.kind === 'one' ? e.revision.number : e.revisions.map((r) => r.number)))).toEqual([edit2.number, [d4.number, d3.number, d2.number, d1.number], edit1.number]);
    const run = log[1];
    expect(run.kind === 'display' && displayRunText(run.revisions, nameOf)).toBe('Display of “Screen” changed (4 times): decimals auto → 5, row 1 frozen');
  });

  it('keep runs of different people apart', () => {
    const a = settings({}, { precision: 2 });
    const b = { ...settings({ precision: 2 }, { precision: 3 }), author: ben };
    expect(groupLog([b, a])).toHaveLength(2);
  });
});

describe('the audit line of a restore', () => {
  it('names the sheet when one sheet was brought back', () => {
    const entry = (details: Record<string, unknown>) => ({ id: 1, action: 'revision.restored', actor: null, createdAt: 0, details }) as never;
    expect(describeAudit(entry({ restoredFrom: 3, revision: 9, sheetId: 's1', sheetName: 'Screen' }), () => undefined)).toBe('brought back sheet “Screen” as it was after revision #3, as revision #9');
    expect(describeAudit(entry({ restoredFrom: 3, revision: 9 }), () => undefined)).toBe('restored revision #3 as revision #9');
  });
});
