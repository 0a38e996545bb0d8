// SECULAR and ORBITAL: the secular problem det(H − ES) = 0 for any symmetric H typed into a range,
// with an optional overlap matrix S handled by Löwdin orthogonalization.
import type { CatalogEntry, ParamSpec, Table } from './types.js';
import { solveSecular, type EigenSystem } from '../chem/eigen.js';
import { isBlankTable, readOverlapMatrix, readSymmetricMatrix } from '../chem/matrixInput.js';
import { checkSpillLength, column, MAX_SPILL_ROWS, pickIndex } from './huckelSpill.js';
import { ChemError, type SpillArg } from './types.js';
import { matrixProblem } from '../limits.js';

const LOWDIN = 'P.-O. Löwdin, J. Chem. Phys. 18, 365 (1950): H′ = S^-1/2 H S^-1/2, C = S^-1/2 C′';

const hamiltonian: ParamSpec = {
  name: 'Hrange',
  type: 'range',
  description: 'Square symmetric matrix H (any energy unit, or β units).',
};
const overlap: ParamSpec = {
  name: 'Srange',
  type: 'range',
  optional: true,
  description: 'Overlap matrix S, same size, 1 on the diagonal, positive definite; omit (or leave empty) for S = 1.',
};

function solve(h: Table, s: Table | undefined): EigenSystem {
  const tooBig = matrixProblem(h.length, h[0]?.length ?? 0);
  if (tooBig) throw new ChemError(tooBig);
  const H = readSymmetricMatrix(h, 'the H range');
  const S = isBlankTable(s) ? undefined : readOverlapMatrix(s!, H.length);
  return solveSecular(H, S, 'ascending');
}

/** Rows for a matrix-sized result from the H argument's formula text. */
function matrixRows(arg: SpillArg | undefined) {
  if (arg?.kind === 'range' && arg.rows === arg.cols && arg.rows > 1) return { rows: Math.min(arg.rows, MAX_SPILL_ROWS), cols: 1 };
  if (arg?.kind === 'range') return { rows: 1, cols: 1 };
  return { rows: MAX_SPILL_ROWS, cols: 1 };
}

export const secularEntries: CatalogEntry[] = [
  {
    name: 'SECULAR',
    family: 'Hückel',
    summary: 'Roots E of det(H − ES) = 0, lowest first (spilled), or root k.',
    params: [hamiltonian, overlap, { name: 'k', type: 'integer', optional: true, description: 'Root number (1 = lowest); omit to spill all.' }],
    returns: { description: 'roots in ascending order, in the unit of H', kind: 'array' },
    examples: [
      { formula: '=SECULAR({0,1;1,0},,1)', expected: -1, tolerance: 1e-12 },
      { formula: '=SECULAR({0,1;1,0},{1,0.25;0.25,1},1)', expected: -1.3333333333, tolerance: 1e-9, note: '(Haa − Hab)/(1 − S) for Haa = 0, Hab = 1, S = 0.25' },
      { formula: '=SECULAR({0,1;1,0},{1,0.25;0.25,1},2)', expected: 0.8, tolerance: 1e-9, note: '(Haa + Hab)/(1 + S)' },
    ],
    source: `${LOWDIN}. Roots are listed lowest first, as for energies; HUCKEL lists β-unit levels most bonding first instead. Unused spill rows stay empty.`,
    spill: (args) => (args.length >= 3 ? { rows: 1, cols: 1 } : matrixRows(args[0])),
    implementation: (h: Table, s?: Table, k?: number) => {
      const { values } = solve(h, s);
      if (k !== undefined) return pickIndex(values, k, 'root', 'roots');
      checkSpillLength(values.length, 'SECULAR', 'SECULAR(H, S, k)');
      return column(values);
    },
  },
  {
    name: 'ORBITAL',
    family: 'Hückel',
    summary: 'Coefficients of orbital k (roots numbered lowest first, as SECULAR) over the basis functions; spilled, or one coefficient.',
    params: [
      hamiltonian,
      // Written ORBITAL(H,,k) without overlap: S stays in second place but is a required slot (it may be
      // left empty), because a required k cannot follow an optional argument.
      { ...overlap, optional: false, description: 'Overlap matrix S (as for SECULAR); leave the slot empty, ORBITAL(H,,k), for S = 1.' },
      { name: 'k', type: 'integer', description: 'Orbital number (1 = lowest root).' },
      { name: 'atom', type: 'integer', optional: true, description: 'Basis function (row of H) whose coefficient to return; omit to spill all.' },
    ],
    returns: { description: 'coefficients c_i, normalised so CᵀSC = 1; sign chosen so the largest is positive', kind: 'array' },
    examples: [
      { formula: '=ORBITAL({0,1;1,0},,2,1)', expected: 0.7071067812, tolerance: 1e-9, note: 'in-phase combination (1,1)/√2' },
      { formula: '=ORBITAL({0,1;1,0},{1,0.25;0.25,1},1,2)', expected: -0.8164965809, tolerance: 1e-9, note: '1/√(2(1 − S)) for the out-of-phase orbital' },
    ],
    source: `${LOWDIN}. Eigenvectors have no intrinsic sign; the largest coefficient is made positive.`,
    spill: (args) => (args.length >= 4 ? { rows: 1, cols: 1 } : matrixRows(args[0])),
    implementation: (h: Table, s: Table | undefined, k: number, atom?: number) => {
      const { vectors } = solve(h, s);
      const vector = pickIndex(vectors, k, 'orbital', 'orbitals');
      if (atom !== undefined) return pickIndex(vector, atom, 'basis function', 'basis functions');
      checkSpillLength(vector.length, 'ORBITAL', 'ORBITAL(H, S, k, atom)');
      return column(vector);
    },
  },
];
