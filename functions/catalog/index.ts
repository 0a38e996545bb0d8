import type { CatalogEntry } from './types.js';
import { diatomicFunctions } from './diatomic.js';
import { lcaoFunctions } from './lcao.js';
import { unitFunctions } from './units.js';
import { huckelEntries } from './huckel.js';
import { ehtEntries } from './eht.js';
import { spectraEntries } from './spectra.js';

// Each family file exports an array of entries; add new families here.
export const catalog: CatalogEntry[] = [
  ...diatomicFunctions,
  ...lcaoFunctions,
  ...unitFunctions,
  ...huckelEntries,
  ...ehtEntries,
  ...spectraEntries,
];

export const catalogByName = new Map(catalog.map((e) => [e.name, e]));
