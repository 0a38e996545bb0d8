// The first-screenful preview of a large sheet must show exactly what the full engine computes, and
// must not be used when a formula in the window could depend on anything outside it.
import { allowedActions } from '../shared/permissions.js';
import { describe, expect, it } from 'vitest';
import type { CellEntry, WorkbookPayload } from '../shared/workbooks.js';
import { buildPreview, previewThresholdCells } from '../src/core/workbook/model/windowPreview.js';
import { WorkbookModel } from '../src/core/workbook/model/workbookModel.js';

const SPECIES = ['O2', 'N2', 'CO', 'NO+', 'Xq2', 'OH'];

function screeningCells(rows: number): CellEntry[] {
  const cells: CellEntry[] = [];
  for (let r = 0; r < rows; r++) {
    cells.push([r, 0, SPECIES[r % SPECIES.length]], [r, 1, `=BONDORDER(A${r + 1})`], [r, 2, `=UNPAIRED(A${r + 1})`], [r, 3, `=B${r + 1}*2`]);
    for (let c = 4; c < 10; c++) cells.push([r, c, String(r + c / 10)]);
  }
  return cells;
}

function payload(cells: CellEntry[], extraSheet = false): WorkbookPayload {
  const sheets = [{ id: 's1', name: 'Screen', position: 0, settings: {}, cells }];
  if (extraSheet) sheets.push({ id: 's2', name: 'Limits', position: 1, settings: {}, cells: [[0, 0, '2.5']] });
  return { id: 'wb', title: 'Large screen', revision: 1, role: 'owner', actions: allowedActions(['owner']), sheets };
}

const large = screeningCells(previewThresholdCells / 10 + 10);

describe('first-screenful preview', () => {
  it('shows the same values and errors as the full engine for the window rows', () => {
    const preview = buildPreview(payload(large), 40)!;
    expect(preview).not.toBeNull();
    const full = new WorkbookModel(payload(large));
    const fullRows = full.rows('s1');
    for (let r = 0; r < 40; r++) {
      for (let c = 0; c < 10; c++) {
        expect([r, c, preview.rows[r][c]?.display, preview.rows[r][c]?.errorMessage]).toEqual([r, c, fullRows[r][c]?.display, fullRows[r][c]?.errorMessage]);
      }
    }
    full.dispose();
  });

  it('is not built for a sheet small enough to load whole', () => {
    expect(buildPreview(payload(screeningCells(50)))).toBeNull();
  });

  it('is refused when a window formula reads rows below the window', () => {
    const cells: CellEntry[] = [...large, [0, 11, '=SUM(E1:E2000)']];
    expect(buildPreview(payload(cells), 40)).toBeNull();
  });

  it('is refused when a window formula reads another sheet', () => {
    const cells: CellEntry[] = [...large, [0, 11, '=Limits!A1*2']];
    expect(buildPreview(payload(cells, true), 40)).toBeNull();
  });

  it('is refused for dynamic references and for array results that could be blocked below', () => {
    expect(buildPreview(payload([...large, [0, 11, '=INDIRECT("E5")']]), 40)).toBeNull();
    expect(buildPreview(payload([...large, [39, 11, '={1;2;3}']]), 40)).toBeNull();
  });

  it('ignores "!" and function names inside quoted text', () => {
    const cells: CellEntry[] = [...large, [0, 11, '=LEN("INDIRECT(x)!")']];
    expect(buildPreview(payload(cells), 40)?.rows[0][11]?.display).toBe('12');
  });
});
