// The chart a sheet keeps in its settings JSON (`settings.chart`): which columns it plots, how, and
// which column names the points. Saved with the workbook so it is there again on the next open.
import { z } from 'zod';
import { maxColIndex } from './a1.js';

export const chartKinds = ['scatter', 'line', 'compare'] as const;
export type ChartKind = (typeof chartKinds)[number];

const column = z.int('must be a column index from 0').min(0, 'must be a column index from 0').max(maxColIndex, `must be a column index up to ${maxColIndex}`);

export const chartSpecSchema = z.object({
  x: column,
  y: column,
  kind: z.enum(chartKinds, `must be one of ${chartKinds.join(', ')}`),
  /** The column whose text names each point (species, molecule); null: none. */
  label: column.nullable(),
});

export type ChartSpec = z.infer<typeof chartSpecSchema>;

/** The chart stored in a sheet's settings, or null when none is stored or it no longer reads. */
export function readChartSpec(settings: Record<string, unknown> | undefined): ChartSpec | null {
  const parsed = chartSpecSchema.safeParse(settings?.chart);
  return parsed.success ? parsed.data : null;
}
