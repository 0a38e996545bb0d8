// Reading a Hamiltonian or overlap matrix typed into a sheet range: every cell a number, the range
// square and symmetric. Validate here, at the edge, so the solvers can trust their input.
import { ChemError, type Table } from './errors.js';

/** Tolerance for symmetry, relative to the largest element (typed values are rounded by hand). */
const SYMMETRY_TOLERANCE = 1e-9;

/** True when an optional range was omitted or left empty (every cell blank). */
export function isBlankTable(table: Table | undefined): boolean {
  return !table || table.every((row) => row.every((cell) => cell === '' || cell === undefined || cell === null));
}

/** Converts a sheet range into a square symmetric matrix of numbers, naming the first fault it finds. */
export function readSymmetricMatrix(table: Table, what: string): number[][] {
  const rows = table.length;
  const cols = table[0]?.length ?? 0;
  if (rows !== cols) throw new ChemError(`${what} must be a square range, got ${rows} rows × ${cols} columns`);
  const matrix = table.map((row, i) =>
    row.map((cell, j) => {
      if (typeof cell !== 'number' || !Number.isFinite(cell)) {
        const shown = cell === '' ? 'an empty cell' : `'${String(cell)}'`;
        throw new ChemError(`${what} must hold numbers only: row ${i + 1}, column ${j + 1} is ${shown}`);
      }
      return cell;
    }),
  );
  const scale = Math.max(1, ...matrix.flat().map(Math.abs));
  for (let i = 0; i < rows; i++)
    for (let j = i + 1; j < rows; j++)
      if (Math.abs(matrix[i][j] - matrix[j][i]) > SYMMETRY_TOLERANCE * scale)
        throw new ChemError(
          `${what} must be symmetric: element (${i + 1},${j + 1}) = ${matrix[i][j]} but (${j + 1},${i + 1}) = ${matrix[j][i]}`,
        );
  return matrix;
}

/** An overlap matrix: symmetric, same size as H, unit diagonal (normalised orbitals). */
export function readOverlapMatrix(table: Table, size: number): number[][] {
  const overlap = readSymmetricMatrix(table, 'the overlap range S');
  if (overlap.length !== size)
    throw new ChemError(`the overlap range S is ${overlap.length}×${overlap.length} but H is ${size}×${size}; they must match`);
  overlap.forEach((row, i) => {
    if (Math.abs(row[i] - 1) > 1e-9)
      throw new ChemError(`the overlap range S must have 1 on its diagonal (normalised orbitals): S(${i + 1},${i + 1}) = ${row[i]}`);
  });
  return overlap;
}
