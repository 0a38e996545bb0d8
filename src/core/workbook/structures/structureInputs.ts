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

/** Distinct structure inputs of the workbook's extended-Hückel formulas, in sheet and row order. */
export function structureInputsOf(payload: Pick<WorkbookPayload, 'sheets'>): StructureInput[] {
  const out = new Map<string, StructureInput>();
  for (const sheet of [...payload.sheets].sort((a, b) => a.position - b.position)) {
    let inputs: Map<string, string> | null = null;
    for (const [, , input] of sheet.cells) {
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
        inputs ??= new Map(sheet.cells.map(([r, c, v]) => [`${r}:${c}`, v]));
        const cell = inputs.get(`${Number(m[3]) - 1}:${columnIndex(m[2])}`);
        if (plainText(cell)) structure = cell;
      }
      if (!structure?.trim()) continue;
      const key = `${charge ?? ''}\u0000${structure}`;
      if (!out.has(key)) out.set(key, charge === undefined ? { structure } : { structure, charge });
    }
  }
  return [...out.values()];
}
