// The panel beside the grid: the structure of the selected cell, or a chart of the sheet's columns.
import { ChartPanel } from '../../features/chart/ChartPanel.js';
import { StructurePanel } from '../../features/diagram/StructurePanel.js';
import type { SheetView } from '../../features/grid/useSheetView.js';

type StructureSource = Parameters<typeof StructurePanel>[0]['source'];

export function SidePanel(p: { panel: 'structure' | 'chart'; structureSource: StructureSource; address: string; view: SheetView; colCount: number; firstRow: number; initialX: number }) {
  return (
    <aside aria-label={p.panel === 'structure' ? 'Structure of the selected cell' : 'Chart'} data-grid-shield="" onMouseDown={(e) => e.stopPropagation()} className="flex w-[26rem] shrink-0 flex-col overflow-y-auto border-l border-line bg-surface">
      <div className="flex-1">
        {p.panel === 'structure' ? (
          <StructurePanel source={p.structureSource} address={p.address} />
        ) : (
          <ChartPanel rows={p.view.rows} colCount={p.colCount} firstRow={p.firstRow} headerRow={p.view.frozenRow} initialX={p.initialX} />
        )}
      </div>
    </aside>
  );
}
