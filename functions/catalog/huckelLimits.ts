// The Hückel family's size limits (functions/limits.ts), checked before the chemistry cache parses
// or solves anything: a SMILES too long to perceive quickly, a π system too large to diagonalise in
// well under a second, a matrix range too large. functions/chem stays free of product limits.
import { huckelModelOf as solveModel, piSystemOf as perceive, requireSmiles as smilesOnly, structureText } from '../chem/huckelCache.js';
import type { HuckelModel } from '../chem/huckel.js';
import type { PiSystem } from '../chem/piSystem.js';
import { matrixProblem, piCentresProblem, smilesAtomsProblem } from '../limits.js';
import { ChemError, type Table } from './types.js';

/**
 * Heavy atoms written in a SMILES string: bracket atoms other than hydrogen, and the organic subset
 * outside brackets (OpenSMILES grammar). Counted from the text, before any parsing.
 */
export function smilesHeavyAtomCount(smiles: string): number {
  let n = 0;
  for (const m of smiles.matchAll(/\[([^\]]*)\]|Cl|Br|[BCNOPSFI]|[bcnops]/g)) if (m[1] === undefined || !/^\d*H\d*[+-]?\d*$/.test(m[1])) n++;
  return n;
}

function refuse(problem: string | null) {
  if (problem) throw new ChemError(problem);
}

/** The π system of a SMILES string, refused past the heavy-atom limit. */
export function piSystemOf(smiles: string): PiSystem {
  refuse(smilesAtomsProblem(smilesHeavyAtomCount(smiles)));
  return perceive(smiles);
}

/** A solved model, refused past the π-centre or matrix limit. */
export function huckelModelOf(structure: Table, params?: string): HuckelModel {
  const smiles = structureText(structure);
  if (smiles !== undefined) refuse(piCentresProblem(piSystemOf(smiles).centres.length));
  else refuse(matrixProblem(structure.length, structure[0]?.length ?? 0));
  return solveModel(structure, params);
}

/** The π system behind a SMILES structure argument (see requireSmiles in the chemistry cache). */
export function requireSmiles(structure: Table, functionName: string): PiSystem {
  const smiles = structureText(structure);
  if (smiles !== undefined) piSystemOf(smiles);
  return smilesOnly(structure, functionName);
}
