// `cli recalc in.xlsx out.xlsx`: reads a workbook, computes it with the app's engine and catalog,
// and writes it with each formula's value cached beside it — for pipelines and scheduled reports.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { finished } from 'node:stream/promises';
import { isEngineError, type ComputedWorkbook } from '../xlsx/engineValues.js';
import { SpreadsheetError } from '../xlsx/limits.js';
import { readSpreadsheet } from '../xlsx/read.js';
import { sheetNameFromFilename } from '../xlsx/readCsv.js';
import { settingsFromParsed } from '../xlsx/sheetSettings.js';
import type { ExportWorkbook } from '../xlsx/types.js';
import { writeWorkbookXlsx } from '../xlsx/writeXlsx.js';
import { EXIT_FAILED, EXIT_OK, EXIT_USAGE, type CliCommand, type CliIO } from './io.js';

export const recalcUsage = `Usage: cli recalc [--values] [--no-about-sheet] [--strict] <in.xlsx|in.csv> <out.xlsx>

Reads the workbook with the same checks and limits as an upload, computes every formula with the
engine and cell functions of the app, and writes out.xlsx with each formula's value cached beside
it, so any spreadsheet program shows the values. Sheets, column widths, frozen panes and merged
cells are kept; cell formatting is not.
  --values          write values only, no formulas (for programs that do not know Orbitab's functions)
  --no-about-sheet  leave out the front sheet "About this export" (models used, cautions)
  --strict          exit 1 when any formula gives an error (the file is still written)
Cells the reader could not take are listed on stderr.

Exit status: 0 written, 1 the input was refused or the output could not be written (or, with
--strict, a formula gave an error), 2 usage error.`;

const OPTIONS = new Set(['--values', '--no-about-sheet', '--strict']);

export async function runRecalc(args: string[], io: CliIO): Promise<number> {
  const options = new Set(args.filter((a) => a.startsWith('--')));
  const files = args.filter((a) => !a.startsWith('--'));
  const unknown = [...options].find((o) => !OPTIONS.has(o));
  if (unknown || files.length !== 2) {
    io.stderr(unknown ? `recalc: unknown option ${unknown}\n\n${recalcUsage}` : `recalc: give an input and an output file\n\n${recalcUsage}`);
    return EXIT_USAGE;
  }
  const [input, output] = files;
  let buffer: Buffer;
  try {
    buffer = fs.readFileSync(input);
  } catch (e) {
    io.stderr(`recalc: cannot read ${input}: ${(e as Error).message}`);
    return EXIT_FAILED;
  }
  let parsed;
  try {
    parsed = await readSpreadsheet(buffer, path.basename(input));
  } catch (e) {
    if (!(e instanceof SpreadsheetError)) throw e;
    io.stderr(`recalc: ${input} refused: ${e.message}`);
    return EXIT_FAILED;
  }
  for (const s of parsed.summary.skipped) io.stderr(`recalc: skipped ${s.sheet}!${s.address}: ${s.reason}`);
  for (const note of parsed.summary.notes) io.stderr(`recalc: note: ${note}`);

  const workbook: ExportWorkbook = {
    title: sheetNameFromFilename(input),
    revision: null,
    exportedBy: `cli recalc (${os.userInfo().username}@${os.hostname()})`,
    exportedAt: new Date(),
    sheets: parsed.sheets.map((s) => ({ name: s.name, cells: s.cells, settings: settingsFromParsed(s, []) })),
  };
  let computed: ComputedWorkbook;
  try {
    const out = fs.createWriteStream(output);
    const done = finished(out);
    computed = await writeWorkbookXlsx(out, workbook, { mode: options.has('--values') ? 'values' : 'formulas', aboutSheet: !options.has('--no-about-sheet') });
    await done;
  } catch (e) {
    io.stderr(`recalc: cannot write ${output}: ${(e as Error).message}`);
    return EXIT_FAILED;
  }

  const errors = computed.sheets.flatMap((s) => s.cells.filter((c) => c.input?.startsWith('=') && isEngineError(c.value)).map((c) => ({ sheet: s.name, c })));
  for (const { sheet, c } of errors.slice(0, 20)) {
    const e = c.value as { value: string; message: string };
    io.stderr(`recalc: ${sheet} row ${c.row + 1} column ${c.col + 1}: ${e.value}${e.message ? ` ${e.message}` : ''}`);
  }
  const { sheets, cells, formulas } = parsed.summary;
  const count = (n: number, what: string) => `${n} ${what}${n === 1 ? '' : 's'}`;
  io.stdout(`recalc: ${count(sheets, 'sheet')}, ${count(cells, 'cell')}, ${count(formulas, 'formula')} (${errors.length} with an error) → ${output}`);
  return options.has('--strict') && errors.length > 0 ? EXIT_FAILED : EXIT_OK;
}

export const recalcCommand: CliCommand = {
  summary: 'compute a workbook file and write it with cached values (recalc in.xlsx out.xlsx)',
  usage: recalcUsage,
  run: runRecalc,
};
