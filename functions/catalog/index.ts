import type { CatalogEntry } from './types.js';

// Each family file exports an array of entries; add new families here.
export const catalog: CatalogEntry[] = [];

export const catalogByName = new Map(catalog.map((e) => [e.name, e]));
