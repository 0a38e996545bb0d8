// One geometry and one solve per structure: building a conformer from SMILES costs far more than the
// extended-Hückel solve itself (bench/eht.ts), and a screening sheet asks several functions about the
// same molecule, so both are memoised by the cell text (and the charge for the solve). Rejections are
// remembered too (TextMemo), so a column of one bad structure reports its message without rebuilding.
import { solveEht, type EhtModel } from './eht.js';
import { readGeometry, type Geometry3d } from './geometry3d.js';
import { TextMemo } from './textMemo.js';

/** Entries per memo: a 150-atom model with its 300² overlap matrix is ~2 MB, most are far smaller. */
const MEMO_LIMIT = 200;

const geometries = new TextMemo<Geometry3d>(MEMO_LIMIT);
const models = new TextMemo<EhtModel>(MEMO_LIMIT);

/** The 3D geometry for a structure text (SMILES, XYZ or molfile), built once per text. */
export function geometryOf(text: string): Geometry3d {
  const key = text.trim();
  return geometries.get(key, () => readGeometry(key));
}

/** The solved model for a structure text and optional net charge (default: from the structure). */
export function ehtModelOf(text: string, charge?: number): EhtModel {
  const key = `${charge ?? ''}\u0000${text.trim()}`;
  return models.get(key, () => solveEht(geometryOf(text), charge));
}

export function clearEhtCache() {
  geometries.clear();
  models.clear();
}

/** Geometries built and models solved since the last clear (tests and the benchmark). */
export function ehtCacheStats() {
  return { geometryBuilds: geometries.misses, modelSolves: models.misses };
}
