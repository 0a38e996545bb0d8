// The structures a workbook's extended-Hückel formulas will ask for, read from the formula text
// before the engine evaluates anything, so their stored results can be fetched while the stored
// values are on screen: a colleague's cells then go from stored value to computed value without a
// "computing…" moment in between. Only the plain shapes a library uses are read — a function of the
// family applied to a cell on the same sheet, or to quoted text, with an optional literal charge;
// anything else is left to the engine, which asks the structure store as usual. A structure read
// wrongly here costs one unused result, never a wrong value: results are kept under the exact text
// and charge the engine later asks with (ehtKeyText).
import { ehtEntries } from '@functions/catalog/eht.js';
import type { WorkbookPayload } from '@shared/workbooks.js';

export interface StructureInput {
  structure: string;
  charge?: number;
}

/** Function name → position of its charge argument (-1: it takes none), for those whose first argument is the structure. */
const chargeArgument = new Map(ehtEntries.filter((e) => e.params[0]?.name === 'structure').map((e) => [e.name, e.params.findIndex((p) => p.name === 'charge')]));

// =NAME( A1 | $A$1 | "text" [, more arguments without brackets or quotes] )
const CALL = /^=\s*([A-Za-z][A-Za-z0-9.]*)\s*\(\s*(?:\$?([A-Za-z]{1,3})\$?([1-9]\d*)|"((?:[^"]|"")*)")\s*((?:,[^,()"]*)*)\)\s*$/;

function columnIndex(letters: string): number {
  let n = 0;
  for (const ch of letters.toUpperCase()) n = n * 26 + (ch.charCodeAt(0) - 64);
  return n - 1;
}

/** Text the engine passes on unchanged: not a formula, a number, a boolean or an apostrophe-quoted entry. */
function plainText(input: string | undefined): input is string {
  if (!input || /^[='+-]/.test(input)) return false;
  if (Number.isFinite(Number(input)) || /^(true|false)$/i.test(input)) return false;
  return true;
}

type SheetCells = WorkbookPayload['sheets'][number];

/**
 * The scan behind structureInputsOf, a range of cells at a time (a large workbook is read in short
 * tasks while it opens). Sheets in tab order, each from its first cell on; `inputOf` reads another
 * cell's input (the scan otherwise keeps a map of the sheet's cells for the references it meets).
 */
export class StructureInputScan {
  private readonly out = new Map<string, StructureInput>();
  private lookups = new Map<string, (row: number, col: number) => string | undefined>();
  private sheetAt = 0;
  private cellAt = 0;

  constructor(private readonly inputOf?: (sheetId: string, row: number, col: number) => string | undefined) {}

  scan(sheet: SheetCells, from = 0, to = sheet.cells.length) {
    for (let i = from; i < to; i++) {
      const input = sheet.cells[i][2];
      if (input.charCodeAt(0) !== 61 /* = */ || !/^=\s*EHT/i.test(input)) continue;
      const m = CALL.exec(input);
      const at = m ? chargeArgument.get(m[1].toUpperCase()) : undefined;
      if (!m || at === undefined) continue;
      const rest = m[5] ? m[5].split(',').slice(1).map((a) => a.trim()) : [];
      let charge: number | undefined;
      if (at >= 1 && rest.length >= at && rest[at - 1] !== '') {
        if (!/^-?\d+$/.test(rest[at - 1])) continue; // a charge the engine must work out
        charge = Number(rest[at - 1]); // an explicit 0 is stored apart from an omitted charge, as the engine asks
      }
      let structure: string | undefined;
      if (m[4] !== undefined) structure = m[4].replace(/""/g, '"');
      else {
        const cell = this.lookup(sheet)(Number(m[3]) - 1, columnIndex(m[2]));
        if (plainText(cell)) structure = cell;
      }
      if (!structure?.trim()) continue;
      const key = `${charge ?? ''}\u0000${structure}`;
      if (!this.out.has(key)) this.out.set(key, charge === undefined ? { structure } : { structure, charge });
    }
  }

  private lookup(sheet: SheetCells): (row: number, col: number) => string | undefined {
    let found = this.lookups.get(sheet.id);
    if (!found) {
      const inputOf = this.inputOf;
      if (inputOf) found = (row, col) => inputOf(sheet.id, row, col);
      else {
        const inputs = new Map(sheet.cells.map(([r, c, v]) => [`${r}:${c}`, v]));
        found = (row, col) => inputs.get(`${row}:${col}`);
      }
      this.lookups.set(sheet.id, found);
    }
    return found;
  }

  /** Scans the sheets in tab order for about `budgetMs`; true once every cell has been read. */
  step(sheets: readonly SheetCells[], budgetMs: number): boolean {
    const started = performance.now();
    while (this.sheetAt < sheets.length) {
      const sheet = sheets[this.sheetAt];
      const to = Math.min(sheet.cells.length, this.cellAt + 5_000);
      this.scan(sheet, this.cellAt, to);
      this.cellAt = to;
      if (to >= sheet.cells.length) {
        this.sheetAt++;
        this.cellAt = 0;
      }
      if (performance.now() - started >= budgetMs) break;
    }
    return this.sheetAt >= sheets.length;
  }

  result(): StructureInput[] {
    return [...this.out.values()];
  }
}

/** Distinct structure inputs of the workbook's extended-Hückel formulas, in sheet and row order. */
export function structureInputsOf(payload: Pick<WorkbookPayload, 'sheets'>): StructureInput[] {
  const scan = new StructureInputScan();
  for (const sheet of [...payload.sheets].sort((a, b) => a.position - b.position)) scan.scan(sheet);
  return scan.result();
}
