// Structure files as a sheet: an SDF (one or many molfile records, each ended by "$$$$"), a single MOL
// file, or XYZ text (one or many frames, each "count / comment / atoms"). One row per record with its
// name, SMILES, formula and the record itself, so the extended-Hückel columns the import adds read the
// file's own 3D coordinates. Records that cannot be read are reported one by one, naming the record
// number; the others are taken. Molfiles are read by openchemlib; XYZ frames by our reader, and as
// XYZ has no bonds, theirs are perceived from the coordinates (xyzSmiles.ts) to give the SMILES.
import { Molecule } from 'openchemlib';
import { chargeFromComment } from '../../functions/chem/xyzComment.js';
import { evaluationLimits } from '../../functions/limits.js';
import { cellInputProblem } from '../../shared/cellInput.js';
import { plural } from '../../shared/plural.js';
import { SpreadsheetError } from '../xlsx/limits.js';
import { sheetNameFromFilename } from '../xlsx/readCsv.js';
import type { CellTriple, ParsedWorkbook, SkippedCell } from '../xlsx/types.js';
import { smilesFromFrame } from './xyzSmiles.js';

export type StructureFileKind = 'sdf' | 'xyz';

/** Records one file may hold: each row gets several extended-Hückel formulas, each a solve on the server. */
export const maxStructureRecords = 5_000;

/** What each added formula column computes; the record (or, for a 2D record, the SMILES) is its argument. */
export const structureFormulaColumns = [
  { header: 'HOMO (eV)', fn: 'EHTHOMO' },
  { header: 'LUMO (eV)', fn: 'EHTLUMO' },
  { header: 'Gap (eV)', fn: 'EHTGAP' },
] as const;

export const structureHeaders = ['Name', 'SMILES', 'Formula', 'Record', ...structureFormulaColumns.map((c) => c.header)];

interface StructureRow {
  name: string;
  smiles: string;
  formula: string;
  record: string;
  /** Whether the record carries 3D coordinates and every hydrogen (else the formulas use the SMILES). */
  usable3d: boolean;
  /** A net charge the record's text does not carry (an XYZ comment's "charge=-1"), passed to the formulas. */
  charge?: number;
}

class RecordProblem extends Error {}

/** Hill order: C, then H, then the rest alphabetically; without carbon all alphabetically (common practice). */
export function hillFormula(elements: string[]): string {
  const counts = new Map<string, number>();
  for (const e of elements) counts.set(e, (counts.get(e) ?? 0) + 1);
  const keys = [...counts.keys()].sort();
  const order = counts.has('C') ? ['C', ...(counts.has('H') ? ['H'] : []), ...keys.filter((k) => k !== 'C' && k !== 'H')] : keys;
  return order.map((k) => `${k}${counts.get(k)! > 1 ? counts.get(k) : ''}`).join('');
}

function molfileRow(record: string, index: number): StructureRow {
  const lines = record.split('\n');
  const end = lines.findIndex((l) => l.startsWith('M  END'));
  if (end < 0) throw new RecordProblem('no "M  END" line, so the molfile is incomplete');
  const molfile = lines.slice(0, end + 1).join('\n');
  let molecule: Molecule;
  try {
    molecule = Molecule.fromMolfile(molfile);
  } catch (e) {
    throw new RecordProblem(`cannot read the molfile (${e instanceof Error ? e.message : String(e)})`);
  }
  if (molecule.getAllAtoms() === 0) throw new RecordProblem('the molfile holds no atoms');
  // The name: the molfile's first line, else an SDF data field called name/title, else the record number.
  const field = /^>\s*<(?:name|title|id)>[^\n]*\n([^\n]+)/im.exec(lines.slice(end + 1).join('\n'));
  const name = (lines[0].trim() || field?.[1].trim() || `record ${index}`).slice(0, 200);
  molecule.ensureHelperArrays(Molecule.cHelperNeighbours);
  let implicitH = false;
  for (let a = 0; a < molecule.getAtoms(); a++) if (molecule.getImplicitHydrogens(a) > 0) implicitH = true;
  const is2d = /^.{20}2D/.test(lines[1] ?? '') || Array.from({ length: molecule.getAllAtoms() }, (_, a) => molecule.getAtomZ(a)).every((z) => z === 0);
  return {
    name,
    smiles: molecule.toIsomericSmiles(),
    formula: molecule.getMolecularFormula().formula,
    record: molfile,
    usable3d: !implicitH && !is2d,
  };
}

/** Splits XYZ text into frames; a frame that cannot be read is reported and, where its count allows, skipped. A frame whose bonds cannot be perceived is taken without SMILES, and `unbonded` says why. */
function xyzRows(text: string, report: (index: number, problem: string) => void, rows: StructureRow[], unbonded: string[]) {
  const lines = text.split('\n');
  let at = 0;
  let index = 0;
  while (at < lines.length) {
    if (lines[at].trim() === '') {
      at++;
      continue;
    }
    index++;
    if (index > maxStructureRecords) throw new SpreadsheetError('too_many_cells', `the file holds more than ${maxStructureRecords.toLocaleString('en')} frames; split it`);
    const countText = lines[at].trim();
    if (!/^\d+$/.test(countText)) {
      report(index, `expected the atom count on line ${at + 1}, found "${countText.slice(0, 40)}"; the frames after it cannot be found`);
      return;
    }
    const count = Number(countText);
    const comment = (lines[at + 1] ?? '').trim();
    const atomLines = lines.slice(at + 2, at + 2 + count);
    at += 2 + count;
    if (count === 0 || atomLines.length < count) {
      report(index, count === 0 ? 'the frame announces 0 atoms' : `the frame announces ${count} atoms but the file ends after ${atomLines.length}`);
      continue;
    }
    const elements: string[] = [];
    const coordinates: [number, number, number][] = [];
    const bad = atomLines.findIndex((line) => {
      const parts = line.trim().split(/\s+/);
      const xyz = parts.slice(1, 4).map(Number);
      const ok = parts.length >= 4 && /^[A-Za-z]{1,2}$/.test(parts[0]) && xyz.every((v) => Number.isFinite(v));
      if (ok) {
        elements.push(parts[0].charAt(0).toUpperCase() + parts[0].slice(1).toLowerCase());
        coordinates.push([xyz[0], xyz[1], xyz[2]]);
      }
      return !ok;
    });
    if (bad >= 0) {
      report(index, `atom line ${bad + 1} "${atomLines[bad].trim().slice(0, 40)}" is not "element x y z"`);
      continue;
    }
    // The comment is the name; ";" separates atoms in a cell's XYZ text, so it may not stand in the comment.
    const name = comment.replace(/;/g, ',').slice(0, 200) || `frame ${index}`;
    const record = [String(count), name, ...atomLines.map((l) => l.trim())].join('\n');
    // Read from the comment as the cell will hold it, so the charge argument written below always
    // agrees with what the EHT functions read from the record's own comment line.
    const charge = chargeFromComment(name) ?? 0;
    const perceived = smilesFromFrame(elements, coordinates, charge);
    if ('problem' in perceived) unbonded.push(`record ${index} ("${name.slice(0, 60)}"): SMILES left empty, ${perceived.problem}`);
    rows.push({ name, smiles: 'smiles' in perceived ? perceived.smiles : '', formula: hillFormula(elements), record, usable3d: true, charge });
  }
}

/** Frames whose bonds were shown in the notes one by one; beyond this, a count. */
const unbondedListed = 20;

function xyzNotes(frames: number, unbonded: string[]): string[] {
  const perceived = frames - unbonded.length;
  const frameCount = (k: number) => plural(k, 'frame');
  const notes = [
    `XYZ frames carry no bonds: ${perceived.toLocaleString('en')} of ${frameCount(frames)} got bonds and SMILES perceived from their coordinates (a heuristic from covalent radii and usual valences; check unusual species)`,
    ...unbonded.slice(0, unbondedListed),
  ];
  if (unbonded.length > unbondedListed) notes.push(`and ${frameCount(unbonded.length - unbondedListed)} more without SMILES`);
  return notes;
}

export function structureKindOf(text: string, ext: string): StructureFileKind {
  if (ext === 'xyz') return 'xyz';
  if (ext === 'sdf' || ext === 'mol' || ext === 'sd') return 'sdf';
  return /M {2}END|V[23]000/.test(text) ? 'sdf' : 'xyz';
}

/** Reads a structure file into one sheet named after the file. */
export function readStructures(buffer: Uint8Array, filename: string, ext: string): ParsedWorkbook {
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(buffer).replace(/^\uFEFF/, '').replace(/\r\n?/g, '\n');
  } catch {
    throw new SpreadsheetError('damaged_file', 'the structure file is not UTF-8 text');
  }
  const kind = structureKindOf(text, ext);
  const sheet = sheetNameFromFilename(filename);
  const skipped: SkippedCell[] = [];
  const report = (index: number, problem: string) => skipped.push({ sheet, address: `record ${index}`, reason: `record ${index}: ${problem}` });
  const rows: StructureRow[] = [];
  const unbonded: string[] = [];
  if (kind === 'sdf') {
    const records = text.split(/^\$\$\$\$[^\n]*\n?/m).filter((r) => r.trim() !== '');
    if (records.length > maxStructureRecords)
      throw new SpreadsheetError('too_many_cells', `the file holds ${records.length.toLocaleString('en')} records; at most ${maxStructureRecords.toLocaleString('en')} are imported at once (split the file)`);
    records.forEach((record, i) => {
      try {
        rows.push(molfileRow(record, i + 1));
      } catch (e) {
        if (!(e instanceof RecordProblem)) throw e;
        report(i + 1, e.message);
      }
    });
  } else xyzRows(text, report, rows, unbonded);

  const notes: string[] = [];
  const cells: CellTriple[] = structureHeaders.map((h, c) => [0, c, h] as CellTriple);
  let formulas = 0;
  let row = 1;
  let fromSmiles = 0;
  rows.forEach((r) => {
    const longest = evaluationLimits.maxTextLength;
    if (r.record.length > longest) {
      skipped.push({ sheet, address: `record ${rows.indexOf(r) + 1}`, reason: `record "${r.name}": ${r.record.length.toLocaleString('en')} characters, more than the ${longest.toLocaleString('en')} a cell holds` });
      return;
    }
    const texts = [r.name, r.smiles, r.formula, r.record];
    texts.forEach((t, c) => {
      const input = c === 0 ? t.replace(/^=+/, '') : t;
      if (input !== '' && !cellInputProblem(input)) cells.push([row, c, input]);
    });
    const argument = r.usable3d ? `D${row + 1}` : r.smiles ? `B${row + 1}` : null;
    if (!r.usable3d && r.smiles) fromSmiles++;
    if (argument) {
      const charge = r.usable3d && r.charge ? `,${r.charge}` : '';
      structureFormulaColumns.forEach((col, i) => cells.push([row, 4 + i, `=${col.fn}(${argument}${charge})`]));
      formulas += structureFormulaColumns.length;
    }
    row++;
  });
  if (rows.length === 0 && skipped.length === 0) throw new SpreadsheetError('not_a_spreadsheet', `"${filename}" holds no structure records`);
  if (fromSmiles > 0)
    notes.push(`${fromSmiles.toLocaleString('en')} record${fromSmiles === 1 ? ' has' : 's have'} 2D coordinates or hydrogens without coordinates; their extended-Hückel columns use the SMILES (a generated conformer) instead`);
  if (kind === 'xyz' && rows.length > 0) notes.push(...xyzNotes(rows.length, unbonded));
  return {
    sheets: [{ name: sheet, cells, columnWidths: { 0: 18, 1: 28, 2: 12, 3: 30 }, frozenRows: 1, frozenCols: 1, merged: [] }],
    summary: { sheets: 1, cells: cells.length, formulas, skipped, notes },
  };
}
