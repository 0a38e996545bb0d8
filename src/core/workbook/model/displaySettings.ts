// A sheet's display settings, stored on the server as the sheet's `settings` JSON: column widths,
// a frozen header row and the number of decimal places. Malformed fields fall back to defaults
// rather than breaking the sheet. Fields the grid does not manage (an import's `frozenRows`,
// `frozenCols` and `merged`, which the export writes back) ride along untouched: the server replaces
// the whole settings object on every save, so dropping them here would lose them for good.
import type { SheetSettings } from '@shared/workbooks.js';
import type { Precision } from './valueView.js';

export interface DisplaySettings {
  /** Column index → width in CSS pixels. */
  columnWidths: Record<number, number>;
  /** Keep the first row in view while scrolling (the usual row of column titles). */
  freezeHeaderRow: boolean;
  precision: Precision;
  /** Stored fields this grid does not manage, saved back as they came. */
  kept: SheetSettings;
}

const managed = new Set(['columnWidths', 'freezeHeaderRow', 'precision']);

export const defaultColumnWidthPx = 112;
export const minColumnWidthPx = 36;
export const maxColumnWidthPx = 800;

export function readDisplaySettings(settings: SheetSettings | undefined): DisplaySettings {
  const s = (settings ?? {}) as Record<string, unknown>;
  const widths: Record<number, number> = {};
  if (s.columnWidths && typeof s.columnWidths === 'object') {
    for (const [k, v] of Object.entries(s.columnWidths as Record<string, unknown>)) {
      const col = Number(k);
      if (Number.isInteger(col) && col >= 0 && typeof v === 'number' && Number.isFinite(v)) widths[col] = clampWidth(v);
    }
  }
  const p = s.precision;
  return {
    columnWidths: widths,
    freezeHeaderRow: s.freezeHeaderRow === true,
    precision: typeof p === 'number' && Number.isInteger(p) && p >= 0 && p <= 15 ? p : null,
    kept: Object.fromEntries(Object.entries(settings ?? {}).filter(([key]) => !managed.has(key))),
  };
}

export function writeDisplaySettings(d: DisplaySettings): SheetSettings {
  return {
    ...d.kept,
    columnWidths: Object.fromEntries(Object.entries(d.columnWidths).map(([k, v]) => [k, Math.round(v)])),
    freezeHeaderRow: d.freezeHeaderRow,
    precision: d.precision,
  };
}

export function clampWidth(px: number): number {
  return Math.max(minColumnWidthPx, Math.min(maxColumnWidthPx, px));
}

/** Widths follow their columns when columns are inserted or deleted. */
export function shiftColumnWidths(widths: Record<number, number>, at: number, delta: number): Record<number, number> {
  const out: Record<number, number> = {};
  for (const [k, v] of Object.entries(widths)) {
    const col = Number(k);
    if (col < at) out[col] = v;
    else if (delta < 0 && col < at - delta) continue;
    else out[col + delta] = v;
  }
  return out;
}
