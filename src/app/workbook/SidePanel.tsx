// The panel beside the grid: the structure of the selected cell, or a chart of the sheet's columns.
import { lazy, Suspense } from 'react';
import { StructurePanel } from '../../features/diagram/StructurePanel.js';
import type { SheetView } from '../../features/grid/useSheetView.js';
import type { ChartSpec } from '@shared/chartSpec.js';

// The chart library is a fifth of the workbook page's code: loaded when a chart is first shown, not
// compiled in the page's start-up task.
const ChartPanel = lazy(async () => ({ default: (await import('../../features/chart/ChartPanel.js')).ChartPanel }));

type StructureSource = Parameters<typeof StructurePanel>[0]['source'];

export function SidePanel(p: {
  panel: 'structure' | 'chart';
  structureSource: StructureSource;
  address: string;
  view: SheetView;
  colCount: number;
  filtered: boolean;
  sheetName: string;
  chart: ChartSpec | null;
  onChart: (spec: ChartSpec) => void;
  initialX: number;
  /** Snapped so the grid ends on a column boundary (usePanelWidth); the usual width until measured. */
  widthPx?: number;
}) {
  return (
    <aside
      aria-label={p.panel === 'structure' ? 'Structure of the selected cell' : 'Chart'}
      data-grid-shield=""
      onMouseDown={(e) => e.stopPropagation()}
      style={p.widthPx !== undefined ? { width: p.widthPx } : undefined}
      className="flex w-[26rem] shrink-0 flex-col overflow-y-auto border-l border-line bg-surface"
    >
      <div className="flex-1">
        {p.panel === 'structure' ? (
          <StructurePanel source={p.structureSource} address={p.address} />
        ) : (
          <Suspense fallback={<p className="p-4 text-ui text-ink-2">Loading the chart…</p>}>
            <ChartPanel
              rows={p.view.data}
              sheetRowOf={p.view.sheetRow}
              colCount={p.colCount}
              headerRow={p.view.frozenRow}
              filtered={p.filtered}
              sheetName={p.sheetName}
              spec={p.chart}
              onSpec={p.onChart}
              initialX={p.initialX}
            />
          </Suspense>
        )}
      </div>
    </aside>
  );
}
