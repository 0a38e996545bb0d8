// What a selected cell is about: a diatomic species ("O2", =BONDORDER("NO+"), =UNPAIRED(A2) with
// A2 holding "O2") or a π system written as SMILES (=PIGAP("c1ccccc1")). The side panel draws the
// MO diagram or the Hückel ladder of whatever this finds.
import { catalogByName } from '@functions/catalog/index.js';
import { analyseDiatomic, type DiatomicAnalysis } from '@functions/chem/diatomic.js';
import { huckelModelOf } from '@functions/chem/huckelCache.js';
import type { HuckelModel } from '@functions/chem/huckel.js';
import { DEFAULT_PARAMETER_SET, PARAMETER_SET_NAMES, type ParameterSetName } from '@functions/chem/huckelParams.js';
import { ChemError } from '@functions/chem/errors.js';
import type { EhtSummary } from '@functions/chem/ehtSummary.js';
import { ehtSummaryOf, PendingResult } from '@functions/structureResults.js';

export type CellSubject =
  | { kind: 'diatomic'; text: string; analysis: DiatomicAnalysis }
  | { kind: 'huckel'; smiles: string; model: HuckelModel; parameterSet: ParameterSetName }
  /** An extended-Hückel structure (SMILES, XYZ or molfile); its summary, or 'pending' while the server computes it. */
  | { kind: 'eht'; structure: string; summary: EhtSummary | 'pending' }
  | { kind: 'none'; tried: string[]; problem?: string };

export interface SubjectSource {
  input: string;
  /** The cell's value as text (what the grid shows). */
  display: string;
  /** The displayed text of another cell of the same sheet, by A1 name. */
  textOf: (a1: string) => string | null;
}

/** String literals of a formula ("" is an escaped quote). */
export function stringLiterals(formula: string): string[] {
  return [...formula.matchAll(/"((?:[^"]|"")*)"/g)].map((m) => m[1].replace(/""/g, '"'));
}

/** Plain cell references (A1, $B$2) outside string literals, in order. */
export function cellReferences(formula: string): string[] {
  const withoutStrings = formula.replace(/"(?:[^"]|"")*"/g, '""');
  return [...withoutStrings.matchAll(/(?<![A-Za-z0-9_!$.])\$?([A-Za-z]{1,3})\$?([1-9][0-9]*)(?![A-Za-z0-9_(!])/g)].map((m) => `${m[1].toUpperCase()}${m[2]}`);
}

/** The families of our functions a formula calls. */
export function calledFamilies(formula: string): Set<string> {
  const families = new Set<string>();
  for (const m of formula.matchAll(/([A-Za-z][A-Za-z0-9_.]*)\s*\(/g)) {
    const entry = catalogByName.get(m[1].toUpperCase());
    if (entry) families.add(entry.family);
  }
  return families;
}

function asDiatomic(text: string): DiatomicAnalysis | null {
  try {
    return analyseDiatomic(text.trim());
  } catch {
    return null;
  }
}

/** A Hückel parameter set named in the formula (as text or in a cell it reads), else the default. */
function parameterSetOf(texts: readonly string[]): ParameterSetName {
  for (const t of texts) {
    const name = t.trim().toLowerCase();
    if ((PARAMETER_SET_NAMES as string[]).includes(name)) return name as ParameterSetName;
  }
  return DEFAULT_PARAMETER_SET;
}

function asHuckel(text: string, set: ParameterSetName): HuckelModel | null {
  if (/\s/.test(text)) return null; // SMILES never holds spaces; a sentence is not a structure
  if ((PARAMETER_SET_NAMES as string[]).includes(text.trim().toLowerCase())) return null;
  try {
    return huckelModelOf([[text.trim()]], set);
  } catch {
    return null;
  }
}

/** The structures of an extended-Hückel formula, tried in order; the first that reads (or is on its way) wins. */
function ehtSubject(texts: string[]): CellSubject | null {
  for (const text of texts) {
    try {
      return { kind: 'eht', structure: text, summary: ehtSummaryOf(text) };
    } catch (e) {
      if (e instanceof PendingResult) return { kind: 'eht', structure: text, summary: 'pending' };
      if (!(e instanceof ChemError)) throw e;
    }
  }
  return null;
}

export function subjectOfCell(src: SubjectSource): CellSubject {
  const tried: string[] = [];
  let wantHuckel = false;
  let wantDiatomic = false;
  if (src.input.startsWith('=')) {
    const families = calledFamilies(src.input);
    wantHuckel = families.has('Hückel') || families.has('π spectra');
    wantDiatomic = families.has('Diatomic');
    tried.push(...stringLiterals(src.input));
    for (const ref of cellReferences(src.input)) {
      const text = src.textOf(ref);
      if (text) tried.push(text);
    }
  }
  if (src.input.startsWith('=') && calledFamilies(src.input).has('Extended Hückel')) {
    // XYZ and molfile records run to thousands of characters, so these are not cut at 200.
    const found = ehtSubject([...new Set(tried.map((t) => t.trim()).filter((t) => t.length > 0))]);
    if (found) return found;
  }
  if (src.display) tried.push(src.display);
  const candidates = [...new Set(tried.map((t) => t.trim()).filter((t) => t.length > 0 && t.length < 200))];
  // The panel draws what the cell computes: with the parameter set the formula names.
  const parameterSet = parameterSetOf(src.input.startsWith('=') ? candidates : []);
  for (const text of candidates) {
    if (!wantHuckel) {
      const analysis = asDiatomic(text);
      if (analysis) return { kind: 'diatomic', text, analysis };
    }
    if (!wantDiatomic) {
      const model = asHuckel(text, parameterSet);
      if (model) return { kind: 'huckel', smiles: text, model, parameterSet };
    }
  }
  return { kind: 'none', tried: candidates };
}
