// The workbook `npm run bench:io` moves in and out: 10,000 screening rows × 10 columns = 100,000
// cells of invented data, mixing text, numbers, ISO dates, booleans, two chemistry functions and
// built-in formulas (40% formulas), as a screening list exported for a report would.
import type { CellTriple, ExportWorkbook } from '../server/xlsx/types.js';

const SPECIES = ['H2', 'He2+', 'Li2', 'B2', 'C2', 'N2', 'N2+', 'O2', 'O2+', 'O2-', 'F2', 'CO', 'CN', 'CN-', 'NO', 'NO+', 'OH', 'HF', 'CH', 'NH'];

export function screeningCells(rows: number): CellTriple[] {
  const cells: CellTriple[] = [];
  const header = ['Species', 'Bond order', 'Unpaired', 'Signal (mV)', 'Gain', 'Measured on', 'Batch note', 'Response', 'Checked', 'Magnetism'];
  header.forEach((h, c) => cells.push([0, c, h]));
  for (let r = 1; r < rows; r++) {
    const n = r + 1;
    const day = 1 + (r % 28);
    cells.push(
      [r, 0, SPECIES[r % SPECIES.length]],
      [r, 1, `=BONDORDER(A${n})`],
      [r, 2, `=UNPAIRED(A${n})`],
      [r, 3, String(((r * 7919) % 10007) / 10)],
      [r, 4, String(1 + (r % 13) / 4)],
      [r, 5, `2024-0${1 + (r % 9)}-${String(day).padStart(2, '0')}`],
      [r, 6, `batch ${r % 97}, sensor ${r % 11}`],
      [r, 7, `=D${n}*E${n}`],
      [r, 8, r % 3 === 0 ? 'TRUE' : 'FALSE'],
      [r, 9, `=IF(C${n}>0,"paramagnetic","diamagnetic")`],
    );
  }
  return cells;
}

export function benchWorkbook(rows = 10_000): ExportWorkbook {
  return {
    title: 'Sensor screening (invented, benchmark)',
    revision: 1,
    exportedBy: 'bench',
    exportedAt: new Date('2025-01-01T00:00:00Z'),
    sheets: [{ name: 'Screening', cells: screeningCells(rows), settings: { freezeHeaderRow: true, columnWidths: { 0: 90, 6: 160 } } }],
  };
}
