// Extended Hückel theory (R. Hoffmann, J. Chem. Phys. 39, 1397 (1963)): all valence electrons,
// a minimal basis of Slater-type orbitals, the overlap matrix computed exactly (sto.ts), diagonal
// H_ii = −VSIE (ehtParams.ts), off-diagonal by the Wolfsberg–Helmholz formula
//   H_ij = K S_ij (H_ii + H_jj)/2,  K = 1.75  (M. Wolfsberg and L. Helmholz, J. Chem. Phys. 20, 837
//   (1952); K = 1.75 as chosen by Hoffmann 1963; the unweighted form),
// and the generalized eigenproblem HC = SCE solved by Löwdin orthogonalization (eigen.ts).
// No self-consistency: H does not depend on the charges, so charges come out exaggerated and
// energies are qualitative. Populations: R. S. Mulliken, J. Chem. Phys. 23, 1833 (1955).
import { ChemError, oneBasedIndex } from './errors.js';
import { solveSecular } from './eigen.js';
import { elementParameters, PARAMETRISED_ELEMENTS, WOLFSBERG_HELMHOLZ_K } from './ehtParams.js';
import { netCharge, type Geometry3d } from './geometry3d.js';
import { shellOverlapBlock, type StoShell } from './sto.js';

/** Bohr radius in ångström (CODATA 2018). */
const BOHR_ANGSTROM = 0.529177210903;

/**
 * Size limits: the solve is O(N³) in basis functions. bench/eht.ts measured about 0.56 s of CPU at 242 and
 * 1.0 s at 302 basis functions (2.0 s at 362), so a cell stops near one second: 300 basis functions
 * (e.g. C49H100) and 150 atoms.
 */
export const EHT_MAX_ATOMS = 150;
export const EHT_MAX_BASIS = 300;

/** Levels closer than this (eV) are treated as one degenerate set when filling and describing them. */
const DEGENERACY_EV = 1e-5;

export interface BasisFunction {
  atom: number;
  /** e.g. "2p" */
  shell: string;
  l: 0 | 1;
  energyEv: number;
}

export interface EhtLevel {
  energyEv: number;
  occupancy: number;
}

export interface EhtModel {
  geometry: Geometry3d;
  basis: BasisFunction[];
  overlap: number[][];
  levels: EhtLevel[];
  /** coefficients[k][i]: basis function i in level k (CᵀSC = 1). */
  coefficients: number[][];
  electrons: number;
  charge: number;
  /** Valence electrons of each neutral atom (Mulliken charges are measured from these). */
  atomValence: number[];
}

function shellLabel(n: number, l: 0 | 1) {
  return `${n}${l === 0 ? 's' : 'p'}`;
}

/** Builds and solves the extended-Hückel model of a geometry with the given net charge (default: the structure's own; see netCharge). */
export function solveEht(geometry: Geometry3d, chargeArgument?: number, limits = { atoms: EHT_MAX_ATOMS, basis: EHT_MAX_BASIS }): EhtModel {
  const { elements, coordinates } = geometry;
  const charge = netCharge(geometry, chargeArgument);
  if (elements.length === 0) throw new ChemError('the structure has no atoms');
  if (elements.length > limits.atoms)
    throw new ChemError(`the structure has ${elements.length} atoms; extended-Hückel cells are limited to ${limits.atoms} atoms (hydrogens included)`, 'NUM');
  const basis: BasisFunction[] = [];
  const shellsOfAtom: { shell: StoShell; first: number }[][] = [];
  const atomValence: number[] = [];
  elements.forEach((symbol, atom) => {
    const params = elementParameters(symbol);
    if (!params) throw new ChemError(`no extended-Hückel parameters for ${symbol} (atom ${atom + 1}); parameters cover ${PARAMETRISED_ELEMENTS.join(', ')}`);
    atomValence.push(params.valenceElectrons);
    shellsOfAtom.push(
      params.shells.map((s) => {
        const first = basis.length;
        for (let m = 0; m < 2 * s.l + 1; m++) basis.push({ atom, shell: shellLabel(s.n, s.l), l: s.l, energyEv: s.energyEv });
        return { shell: { n: s.n, l: s.l, zeta: s.zeta }, first };
      }),
    );
  });
  const nBasis = basis.length;
  if (nBasis > limits.basis)
    throw new ChemError(`the structure needs ${nBasis} basis functions; extended-Hückel cells are limited to ${limits.basis} basis functions`, 'NUM');
  const electrons = atomValence.reduce((a, b) => a + b, 0) - charge;
  if (!Number.isInteger(charge)) throw new ChemError(`charge must be a whole number, got ${charge}`, 'NUM');
  if (electrons < 0 || electrons > 2 * nBasis)
    throw new ChemError(`charge ${charge} leaves ${electrons} valence electrons for ${nBasis} orbitals`, 'NUM');

  const overlap = Array.from({ length: nBasis }, (_, i) => {
    const row = new Array<number>(nBasis).fill(0);
    row[i] = 1;
    return row;
  });
  const bohr = coordinates.map((c) => c.map((x) => x / BOHR_ANGSTROM));
  for (let a = 0; a < elements.length; a++)
    for (let b = a + 1; b < elements.length; b++) {
      const v: [number, number, number] = [bohr[b][0] - bohr[a][0], bohr[b][1] - bohr[a][1], bohr[b][2] - bohr[a][2]];
      const distance = Math.hypot(...v);
      if (distance < 0.1 / BOHR_ANGSTROM)
        throw new ChemError(`atoms ${a + 1} (${elements[a]}) and ${b + 1} (${elements[b]}) are ${(distance * BOHR_ANGSTROM).toFixed(3)} Å apart; check the coordinates`);
      for (const sa of shellsOfAtom[a])
        for (const sb of shellsOfAtom[b]) {
          const block = shellOverlapBlock(sa.shell, sb.shell, v);
          block.forEach((row, i) =>
            row.forEach((value, j) => {
              overlap[sa.first + i][sb.first + j] = value;
              overlap[sb.first + j][sa.first + i] = value;
            }),
          );
        }
    }

  const hamiltonian = overlap.map((row, i) =>
    row.map((s, j) => (i === j ? basis[i].energyEv : (WOLFSBERG_HELMHOLZ_K * s * (basis[i].energyEv + basis[j].energyEv)) / 2)),
  );
  const { values, vectors } = solveSecular(hamiltonian, overlap, 'ascending');
  return {
    geometry,
    basis,
    overlap,
    levels: fill(values, electrons),
    coefficients: vectors,
    electrons,
    charge,
    atomValence,
  };
}

/** Aufbau filling, two electrons per level; a partly filled degenerate set shares its electrons equally. */
function fill(energies: number[], electrons: number): EhtLevel[] {
  const levels = energies.map((energyEv) => ({ energyEv, occupancy: 0 }));
  let left = electrons;
  for (let k = 0; k < levels.length && left > 0; ) {
    let end = k + 1;
    while (end < levels.length && levels[end].energyEv - levels[k].energyEv < DEGENERACY_EV) end++;
    const share = Math.min(left, 2 * (end - k)) / (end - k);
    for (let m = k; m < end; m++) levels[m].occupancy = share;
    left -= share * (end - k);
    k = end;
  }
  return levels;
}

/** Indices of the levels degenerate with level k. */
export function degenerateSet(model: EhtModel, k: number): number[] {
  const e = model.levels[k].energyEv;
  return model.levels.map((l, i) => i).filter((i) => Math.abs(model.levels[i].energyEv - e) < DEGENERACY_EV);
}

export function homoIndex(model: EhtModel): number {
  for (let k = model.levels.length - 1; k >= 0; k--) if (model.levels[k].occupancy > 0) return k;
  throw new ChemError('the structure has no valence electrons, so no HOMO');
}

/** The LUMO energy; equal to the HOMO's when the HOMO is a partly filled degenerate set (open shell). */
export function frontier(model: EhtModel): { homoEv: number; lumoEv: number } {
  const h = homoIndex(model);
  const set = degenerateSet(model, h);
  const homoEv = model.levels[h].energyEv;
  if (set.length > 1 && set.some((i) => model.levels[i].occupancy < 2)) return { homoEv, lumoEv: homoEv };
  const l = model.levels.findIndex((level, i) => i > h && level.occupancy === 0);
  if (l === -1) throw new ChemError('every orbital is filled, so there is no LUMO');
  return { homoEv, lumoEv: model.levels[l].energyEv };
}

/** Σ n_k ε_k, eV. */
export function oneElectronEnergy(model: EhtModel): number {
  return model.levels.reduce((sum, l) => sum + l.occupancy * l.energyEv, 0);
}

const densities = new WeakMap<EhtModel, number[][]>();

/** P_ij = Σ_k n_k c_ik c_jk, built once per model (a column of charges reads it once per atom). */
function density(model: EhtModel): number[][] {
  const known = densities.get(model);
  if (known) return known;
  const n = model.basis.length;
  const p = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  model.levels.forEach((level, k) => {
    if (level.occupancy === 0) return;
    const c = model.coefficients[k];
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) p[i][j] += level.occupancy * c[i] * c[j];
  });
  densities.set(model, p);
  return p;
}

function checkAtom(model: EhtModel, atom: number, name: string): number {
  const count = model.geometry.elements.length;
  return oneBasedIndex(atom, count, { item: name, items: 'atoms', holder: 'the structure' });
}

/** Mulliken net charge of atom (1-based): valence electrons − gross population. */
export function mullikenCharge(model: EhtModel, atom: number): number {
  const a = checkAtom(model, atom, 'atom');
  const p = density(model);
  let population = 0;
  model.basis.forEach((f, i) => {
    if (f.atom !== a) return;
    for (let j = 0; j < model.basis.length; j++) population += p[i][j] * model.overlap[i][j];
  });
  return model.atomValence[a] - population;
}

/** Mulliken overlap population between two atoms (1-based): 2 Σ_{i∈A, j∈B} P_ij S_ij. */
export function overlapPopulation(model: EhtModel, atomA: number, atomB: number): number {
  const a = checkAtom(model, atomA, 'atom i');
  const b = checkAtom(model, atomB, 'atom j');
  if (a === b) throw new ChemError(`i and j are both atom ${atomA}: an overlap population needs two different atoms`);
  const p = density(model);
  let sum = 0;
  model.basis.forEach((fi, i) => {
    if (fi.atom !== a) return;
    model.basis.forEach((fj, j) => {
      if (fj.atom === b) sum += 2 * p[i][j] * model.overlap[i][j];
    });
  });
  return sum;
}

export interface Contribution {
  atom: number;
  element: string;
  shell: string;
  weight: number;
}

/**
 * Mulliken shares of each atom's shell in level k (c_i Σ_j S_ij c_j, summed over the shell), averaged
 * over the level's degenerate set so the answer does not depend on how the solver mixed that set.
 * Largest first.
 */
export function levelComposition(model: EhtModel, k: number): Contribution[] {
  const set = degenerateSet(model, k);
  const shares = new Map<string, Contribution>();
  for (const level of set) {
    const c = model.coefficients[level];
    model.basis.forEach((f, i) => {
      let share = 0;
      for (let j = 0; j < c.length; j++) share += c[i] * model.overlap[i][j] * c[j];
      const key = `${f.atom}:${f.shell}`;
      const entry = shares.get(key) ?? { atom: f.atom + 1, element: model.geometry.elements[f.atom], shell: f.shell, weight: 0 };
      entry.weight += share / set.length;
      shares.set(key, entry);
    });
  }
  // Symmetry-equivalent atoms tie up to round-off; ties go by atom number so the text is reproducible.
  return [...shares.values()].sort((x, y) => Math.round((y.weight - x.weight) * 1e9) || x.atom - y.atom);
}

/** Text like "O1 2p 0.92; H2 1s 0.04": contributions of at least 0.05, at most four. */
export function describeComposition(parts: Contribution[]): string {
  const shown = parts.filter((p) => p.weight >= 0.05).slice(0, 4);
  return shown.map((p) => `${p.element}${p.atom} ${p.shell} ${p.weight.toFixed(2)}`).join('; ');
}
