// A sheet's settings JSON (column widths, frozen panes, decimals, merged ranges), bounded at the edge:
// the export writes what is stored here, and its xlsx library fills every merged cell one by one, so
// an unbounded merge ("B2:BXX1000000", two billion cells) would run the export out of memory. The
// limits are the ones an imported file already meets (server/xlsx/limits.ts, sheetSettings.ts), so
// nothing a user can make by importing or in the grid is refused.
import { z } from 'zod';
import { maxColIndex, maxRowIndex, parseRangeName, rangeArea, rangeName } from './a1.js';
import { chartSpecSchema } from './chartSpec.js';

/** Column widths, frozen rows, number precision… kept small so a sheet row stays cheap to load. */
export const maxSheetSettingsBytes = 16_384;
/** Cells all merged ranges of a sheet may cover: the import's limit for a whole file (exceljs fills each). */
export const maxMergedCells = 2_000_000;
/** Widest column in CSS pixels: xlsx's widest column (255 characters, ECMA-376 §18.3.1.13) is about 1,790 px. */
export const maxColumnWidthPx = 2_000;
/** Most decimals the grid shows (JavaScript numbers carry 15–17 significant digits). */
export const maxPrecision = 15;

const gridEdge = rangeName({ top: 0, left: 0, bottom: maxRowIndex, right: maxColIndex });

const columnWidths = z.record(
  z.string().regex(/^(0|[1-9][0-9]{0,3})$/, 'keys must be column indexes from 0').refine((k) => Number(k) <= maxColIndex, `keys must be column indexes up to ${maxColIndex}`),
  z.number('must be a number of pixels').positive('must be more than 0 pixels').max(maxColumnWidthPx, `must be at most ${maxColumnWidthPx} pixels`),
);

const mergedRange = z.string('must be a range such as "B2:C3"').refine((text) => {
  const r = parseRangeName(text);
  return r !== null && r.bottom <= maxRowIndex && r.right <= maxColIndex;
}, `must be a range of cells inside the grid (${gridEdge}), such as "B2:C3"`);

/**
 * What is stored: read with care (fileLayoutOf, readDisplaySettings), since rows written before
 * these checks existed may hold anything JSON can.
 */
export type SheetSettings = Record<string, z.core.util.JSONType>;

export const sheetSettingsSchema: z.ZodType<SheetSettings> = z
  .object({
    columnWidths: columnWidths.optional(),
    freezeHeaderRow: z.boolean('must be true or false').optional(),
    frozenRows: z.int('must be a whole number').min(0, 'must be 0 or more').max(maxRowIndex, `must be at most ${maxRowIndex}`).optional(),
    frozenCols: z.int('must be a whole number').min(0, 'must be 0 or more').max(maxColIndex, `must be at most ${maxColIndex}`).optional(),
    precision: z.int('must be a whole number').min(0, 'must be 0 or more').max(maxPrecision, `must be at most ${maxPrecision}`).nullable().optional(),
    merged: z
      .array(mergedRange, 'must be a list of ranges')
      .superRefine((ranges, ctx) => {
        let cells = 0;
        ranges.forEach((text, i) => {
          const r = parseRangeName(text);
          if (!r) return; // reported by the item's own check
          const area = rangeArea(r);
          cells += area;
          if (area > maxMergedCells) ctx.addIssue({ code: 'custom', path: [i], message: `"${text}" merges ${area.toLocaleString('en')} cells; a merged range may cover at most ${maxMergedCells.toLocaleString('en')}` });
        });
        if (cells > maxMergedCells && ranges.every((t) => rangeArea(parseRangeName(t) ?? { top: 0, left: 0, bottom: 0, right: 0 }) <= maxMergedCells)) {
          ctx.addIssue({ code: 'custom', message: `the merged ranges cover ${cells.toLocaleString('en')} cells; at most ${maxMergedCells.toLocaleString('en')} in all` });
        }
      })
      .optional(),
    chart: chartSpecSchema.optional(),
  })
  // Fields a later version adds ride along as plain JSON.
  .catchall(z.json())
  .refine((s) => JSON.stringify(s).length <= maxSheetSettingsBytes, `at most ${maxSheetSettingsBytes} bytes of JSON`)
  .transform((s) => s as SheetSettings);
