// `cli recalc in.xlsx out.xlsx`: the same engine as the app recomputes a workbook file and writes the
// values it computed beside each formula, whatever the input file had cached.
import { execFile } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import ExcelJS from 'exceljs';
import { afterAll, describe, expect, it } from 'vitest';
import { runRecalc } from '../server/cli/recalc.js';
import { plainXlsx } from './helpers/xlsxFixtures.js';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'orbitab-recalc-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

async function run(args: string[]) {
  const out: string[] = [];
  const err: string[] = [];
  const code = await runRecalc(args, { stdout: (l) => out.push(l), stderr: (l) => err.push(l) });
  return { code, out: out.join('\n'), err: err.join('\n') };
}

async function read(file: string) {
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.readFile(file);
  return wb;
}

describe('cli recalc', async () => {
  const input = path.join(dir, 'radicals.xlsx');
  // Stale cached results (0) as a pipeline might hand over; recalc must replace them.
  fs.writeFileSync(
    input,
    await plainXlsx({
      Radicals: [
        ['Species', 'Unpaired', 'Bond order'],
        ['OH', { formula: 'UNPAIRED(A2)', result: 0 } as ExcelJS.CellValue, { formula: 'BONDORDER(A2)', result: 0 } as ExcelJS.CellValue],
        ['NO', { formula: 'UNPAIRED(A3)', result: 0 } as ExcelJS.CellValue, { formula: 'BONDORDER(A3)', result: 0 } as ExcelJS.CellValue],
        ['Xq2', { formula: 'UNPAIRED(A4)', result: 0 } as ExcelJS.CellValue],
      ],
    }),
  );

  it('writes each formula with the value the engine computed, after a front sheet', async () => {
    const output = path.join(dir, 'out.xlsx');
    const r = await run([input, output]);
    expect(r.code).toBe(0);
    expect(r.out).toBe(`recalc: 1 sheet, 11 cells, 5 formulas (1 with an error) → ${output}`);
    expect(r.err).toMatch(/Radicals row 4 column 2: #VALUE! .*Xq/);
    const wb = await read(output);
    expect(wb.worksheets.map((w) => w.name)).toEqual(['About this export', 'Radicals']);
    const sheet = wb.getWorksheet('Radicals')!;
    // OH (X²Π) and NO (X²Π) each have one unpaired electron; NO bond order 2.5 (Atkins & de Paula,
    // Physical Chemistry, "Molecular structure"; Huber & Herzberg 1979 for the ground terms).
    expect(sheet.getCell('B2').value).toEqual({ formula: 'UNPAIRED(A2)', result: 1 });
    expect(sheet.getCell('B3').value).toEqual({ formula: 'UNPAIRED(A3)', result: 1 });
    expect(sheet.getCell('C3').value).toEqual({ formula: 'BONDORDER(A3)', result: 2.5 });
  });

  it('writes values only and leaves the front sheet out when asked', async () => {
    const output = path.join(dir, 'values.xlsx');
    expect((await run(['--values', '--no-about-sheet', input, output])).code).toBe(0);
    const wb = await read(output);
    expect(wb.worksheets.map((w) => w.name)).toEqual(['Radicals']);
    expect(wb.getWorksheet('Radicals')!.getCell('C3').value).toBe(2.5);
  });

  it('exits 1 with --strict when a formula gives an error, still writing the file', async () => {
    const output = path.join(dir, 'strict.xlsx');
    expect((await run(['--strict', input, output])).code).toBe(1);
    expect(fs.existsSync(output)).toBe(true);
  });

  it('exits 1 naming the reason when the input is not a workbook, and 2 on a usage error', async () => {
    const bogus = path.join(dir, 'bogus.xlsx');
    fs.writeFileSync(bogus, 'not a workbook');
    const refused = await run([bogus, path.join(dir, 'never.xlsx')]);
    expect(refused.code).toBe(1);
    expect(refused.err).toMatch(/bogus\.xlsx refused: .*not a zip archive/);
    expect((await run([input])).code).toBe(2);
    expect((await run(['--fast', input, path.join(dir, 'x.xlsx')])).err).toMatch(/unknown option --fast/);
  });

  it('runs as `npm run --silent cli -- recalc in out`', async () => {
    const output = path.join(dir, 'npm.xlsx');
    const { stdout } = await promisify(execFile)('npm', ['run', '--silent', 'cli', '--', 'recalc', input, output], { cwd: path.resolve(import.meta.dirname, '..') });
    expect(stdout.trim()).toBe(`recalc: 1 sheet, 11 cells, 5 formulas (1 with an error) → ${output}`);
    expect(((await read(output)).getWorksheet('Radicals')!.getCell('B2').value as ExcelJS.CellFormulaValue).result).toBe(1);
  }, 120_000);
});
