// Sheets in tab order: how every part of Orbitab orders a workbook's tabs. A module of its own so the
// page's first script (which draws the first rows before the engine's code is in) needs no engine.

/** Sheets in tab order (a stable sort: equal or missing positions keep their order). */
export function inTabOrder<T extends { position?: number }>(sheets: readonly T[]): T[] {
  return sheets.every((s) => s.position !== undefined) ? [...sheets].sort((a, b) => a.position! - b.position!) : [...sheets];
}
