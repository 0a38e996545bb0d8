// Simple Hückel molecular orbital theory (E. Hückel, Z. Phys. 70, 204 (1931); A. Streitwieser,
// Molecular Orbital Theory for Organic Chemists, 1961, chs. 2–5). Energies are E = α + xβ with β < 0,
// so the matrix is written in β units (diagonal h_i, off-diagonal k_ij) and its eigenvalues x are
// listed largest (most bonding) first.
import { ChemError } from './errors.js';
import { solveSymmetric } from './eigen.js';
import { coulombParameter, resonanceParameter, type ParameterSetName } from './huckelParams.js';
import type { PiSystem } from './piSystem.js';

export interface HuckelModel {
  /** The Hückel matrix in β units. */
  matrix: number[][];
  /** Levels x (E = α + xβ), most bonding first. */
  levels: number[];
  /** vectors[k][i]: coefficient of centre i in level k. */
  vectors: number[][];
  /** π electrons of the neutral reading of the input (from the structure, or one per centre for a matrix). */
  electrons: number;
  /** π core charge of each centre: electrons it gives plus its formal charge (1 for a carbon). */
  coreCharges: number[];
  /** Present when the model came from a SMILES structure. */
  pi?: PiSystem;
}

/** Levels closer than this (in β units) are one degenerate set. */
const DEGENERACY_TOLERANCE = 1e-7;

/** Builds the Hückel matrix of a π system with a published parameter set (see huckelParams.ts). */
export function buildHuckelMatrix(pi: PiSystem, set: ParameterSetName): number[][] {
  const n = pi.centres.length;
  const matrix = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  pi.centres.forEach((c, i) => {
    if (!c.type) throw new ChemError(`no Hückel parameters for ${c.label} (atom ${c.atom}) in either published set`);
    matrix[i][i] = coulombParameter(set, c.type, `atom ${c.atom}`);
  });
  for (const { a, b } of pi.bonds) {
    const ca = pi.centres[a];
    const cb = pi.centres[b];
    const k = resonanceParameter(set, ca.type!, cb.type!, `atoms ${ca.atom}–${cb.atom}`);
    matrix[a][b] = k;
    matrix[b][a] = k;
  }
  return matrix;
}

export function modelFromPiSystem(pi: PiSystem, set: ParameterSetName): HuckelModel {
  const matrix = buildHuckelMatrix(pi, set);
  const { values, vectors } = solveSymmetric(matrix, 'descending');
  return {
    matrix,
    levels: values,
    vectors,
    electrons: pi.electrons,
    coreCharges: pi.centres.map((c) => c.electrons + c.formalCharge),
    pi,
  };
}

/** A hand-built matrix: one π electron and core charge +1 per centre unless told otherwise (carbon-like). */
export function modelFromMatrix(matrix: number[][]): HuckelModel {
  const { values, vectors } = solveSymmetric(matrix, 'descending');
  return { matrix, levels: values, vectors, electrons: matrix.length, coreCharges: matrix.map(() => 1) };
}

export function checkElectronCount(model: HuckelModel, electrons: number): number {
  const max = 2 * model.levels.length;
  if (!Number.isInteger(electrons) || electrons < 0 || electrons > max)
    throw new ChemError(`electron count must be a whole number from 0 to ${max} (two per level), got ${electrons}`);
  return electrons;
}

/** Degenerate sets of levels, most bonding first: [first index, size]. */
function degenerateSets(levels: number[]): [number, number][] {
  const sets: [number, number][] = [];
  for (let k = 0; k < levels.length; k++) {
    const last = sets[sets.length - 1];
    if (last && Math.abs(levels[last[0]] - levels[k]) < DEGENERACY_TOLERANCE) last[1]++;
    else sets.push([k, 1]);
  }
  return sets;
}

/**
 * Aufbau occupations. A partly filled degenerate set shares its electrons equally among its levels,
 * which keeps bond orders and charges independent of how the solver chose the degenerate vectors
 * (common practice for open-shell Hückel systems such as cyclobutadiene).
 */
export function occupations(model: HuckelModel, electrons: number): number[] {
  let left = checkElectronCount(model, electrons);
  const occ = new Array<number>(model.levels.length).fill(0);
  for (const [start, size] of degenerateSets(model.levels)) {
    const inSet = Math.min(left, 2 * size);
    for (let k = start; k < start + size; k++) occ[k] = inSet / size;
    left -= inSet;
  }
  return occ;
}

/** Total π energy as the β coefficient: E_π = nα + (Σ n_k x_k)β; returns Σ n_k x_k. */
export function piEnergy(model: HuckelModel, electrons: number): number {
  const occ = occupations(model, electrons);
  return occ.reduce((sum, n, k) => sum + n * model.levels[k], 0);
}

export interface Frontier {
  /** x_HOMO − x_LUMO in |β| units (0 for an open-shell degenerate HOMO set). */
  gap: number;
  homo: number;
  lumo: number;
  openShellDegenerate: boolean;
}

/**
 * HOMO–LUMO gap. The HOMO is the least bonding level holding electrons. When that level belongs to a
 * degenerate set that is only partly filled (cyclobutadiene, cyclopentadienyl radical) the gap is 0.
 * A singly filled non-degenerate level (a radical's SOMO) is the HOMO, and the gap runs to the next
 * empty level.
 */
export function frontierGap(model: HuckelModel, electrons: number): Frontier {
  const occ = occupations(model, electrons);
  if (electrons === 0) throw new ChemError('no π electrons, so there is no HOMO (e.g. a matrix with electrons = 0)');
  const sets = degenerateSets(model.levels);
  let homoSet = -1;
  sets.forEach(([start], s) => {
    if (occ[start] > 0) homoSet = s;
  });
  const [start, size] = sets[homoSet];
  const homo = model.levels[start];
  const setFull = occ[start] > 2 - 1e-12;
  if (!setFull && size > 1) return { gap: 0, homo, lumo: homo, openShellDegenerate: true };
  const next = sets[homoSet + 1];
  if (!next) {
    if (setFull) throw new ChemError(`every π level is full (${electrons} electrons on ${model.levels.length} levels), so there is no LUMO`);
    throw new ChemError('the singly filled HOMO is the highest π level, so there is no empty level above it');
  }
  const lumo = model.levels[next[0]];
  return { gap: homo - lumo, homo, lumo, openShellDegenerate: false };
}

/** Coulson bond order p_ij = Σ_k n_k c_ik c_jk (C. A. Coulson, Proc. R. Soc. A 169, 413 (1939)). */
export function bondOrder(model: HuckelModel, electrons: number, i: number, j: number): number {
  const occ = occupations(model, electrons);
  return occ.reduce((sum, n, k) => sum + n * model.vectors[k][i] * model.vectors[k][j], 0);
}

/** π electron density q_i = Σ_k n_k c_ik² (Coulson). */
export function electronDensity(model: HuckelModel, electrons: number, i: number): number {
  return bondOrder(model, electrons, i, i);
}

/** Net π charge of a centre: its π core charge minus its π electron density. */
export function piCharge(model: HuckelModel, electrons: number, i: number): number {
  return model.coreCharges[i] - electronDensity(model, electrons, i);
}

/**
 * Delocalization energy (β coefficient, positive = stabilized): E_π minus the π energy of the
 * localized Kekulé structure the SMILES describes. Each localized π bond X=Y is an isolated
 * two-centre problem holding 2 electrons at x = (h_X + h_Y)/2 + √(((h_X − h_Y)/2)² + k_XY²)
 * (2 per C=C, the ethylene reference), and every centre outside a localized π bond keeps its own
 * electrons at x = h_X (a lone pair, an empty cation p orbital, a radical). This is the textbook
 * definition (Streitwieser 1961, ch. 9; e.g. benzene 2β, butadiene 0.472β).
 */
export function delocalizationEnergy(model: HuckelModel): number {
  const pi = model.pi;
  if (!pi) throw new ChemError('DELOCALIZATION needs a SMILES structure: a bare matrix has no localized Kekulé structure to compare with');
  const h = (i: number) => model.matrix[i][i];
  const inLocalBond = new Array<boolean>(pi.centres.length).fill(false);
  let localized = 0;
  for (const { a, b, order } of pi.bonds) {
    if (order < 2) continue;
    const k = model.matrix[a][b];
    localized += 2 * ((h(a) + h(b)) / 2 + Math.sqrt(((h(a) - h(b)) / 2) ** 2 + k * k));
    inLocalBond[a] = inLocalBond[b] = true;
  }
  pi.centres.forEach((c, i) => {
    if (!inLocalBond[i]) localized += c.electrons * h(i);
  });
  return piEnergy(model, model.electrons) - localized;
}
