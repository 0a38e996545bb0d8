// Plots two columns of the sheet against each other, as points, as a line, or as predicted (Y)
// against measured (X) with the line of agreement y = x and how far the two lie apart (recharts).
// Only the rows the grid shows are plotted (a filter narrows the chart too); the chart's choices are
// kept in the sheet's settings, so the chart comes back when the workbook is opened again.
import { useMemo, useRef, useState } from 'react';
import { CartesianGrid, Line, LineChart, ReferenceLine, ResponsiveContainer, Scatter, ScatterChart, Tooltip, XAxis, YAxis } from 'recharts';
import { columnName } from '@shared/a1.js';
import type { ChartKind, ChartSpec } from '@shared/chartSpec.js';
import type { RowData } from '../../core/workbook/model/workbookModel.js';
import { agreement, axisTitle, nameColumn, numericPairs, separateCoincident, sortedByX, type PlacedPoint } from './chartData.js';
import { downloadPng, downloadSvg } from './chartExport.js';

export interface ChartPanelProps {
  /** The rows on screen (filtered when a filter is set), without a frozen header row. */
  rows: RowData[];
  sheetRowOf: (i: number) => number;
  colCount: number;
  headerRow: RowData | null;
  filtered: boolean;
  sheetName: string;
  /** The stored chart, or null for a new one starting at `initialX`. */
  spec: ChartSpec | null;
  onSpec: (spec: ChartSpec) => void;
  initialX: number;
}

const axisTick = { fontSize: 11, fill: 'var(--color-ink-3)' };
const axisLabel = (value: string, position: 'insideBottom' | 'insideLeft', angle = 0) => ({ value, position, angle, offset: position === 'insideBottom' ? -2 : 8, style: { fontSize: 11, fill: 'var(--color-ink-2)', textAnchor: 'middle' as const } });

function PointTip({ active, payload, xTitle, yTitle }: { active?: boolean; payload?: { payload: PlacedPoint }[]; xTitle: string; yTitle: string }) {
  const p = active ? payload?.[0]?.payload : undefined;
  if (!p) return null;
  return (
    <div className="rounded-ctl border border-line bg-surface px-2 py-1 text-caption shadow-sm" data-testid="chart-tip">
      <p className="font-semibold text-ink">
        {p.name || 'Unnamed row'} <span className="font-normal text-ink-3">· row {p.row + 1}</span>
      </p>
      <p className="text-ink-2">
        {xTitle}: <span className="font-mono">{Number(p.x.toPrecision(6))}</span>
      </p>
      <p className="text-ink-2">
        {yTitle}: <span className="font-mono">{Number(p.y.toPrecision(6))}</span>
      </p>
    </div>
  );
}

export function ChartPanel(p: ChartPanelProps) {
  const [local, setLocal] = useState<ChartSpec | null>(null);
  const guessedLabel = useMemo(() => nameColumn(p.rows, p.colCount, [p.initialX, p.initialX + 1]), [p.rows, p.colCount, p.initialX]);
  const spec: ChartSpec = local ?? p.spec ?? { x: p.initialX, y: p.initialX + 1, kind: 'scatter', label: guessedLabel };
  const change = (patch: Partial<ChartSpec>) => {
    const next = { ...spec, ...patch };
    setLocal(next);
    p.onSpec(next);
  };
  const box = useRef<HTMLDivElement>(null);
  const { x: xCol, y: yCol, kind } = spec;
  const { points, skipped } = useMemo(() => numericPairs(p.rows, xCol, yCol, p.sheetRowOf, spec.label), [p.rows, xCol, yCol, p.sheetRowOf, spec.label]);
  // The frozen header row names the columns; unfrozen, a text first row above numbers does.
  const title = (c: number) => p.headerRow?.[c]?.display || (p.rows[0]?.[c]?.kind === 'text' ? p.rows[0][c]!.display : undefined);
  const name = (c: number) => (title(c) ? `${columnName(c)} · ${title(c)}` : columnName(c));
  const xTitle = axisTitle(p.rows, xCol, columnName(xCol), title(xCol));
  const yTitle = axisTitle(p.rows, yCol, columnName(yCol), title(yCol));
  const { placed, moved } = useMemo(() => separateCoincident(points), [points]);
  const columnPicker = (label: string, value: number | null, set: (c: number | null) => void, none?: string) => (
    <label className="flex items-center gap-1">
      {label}
      <select aria-label={`${label} column`} value={value ?? ''} onChange={(e) => set(e.target.value === '' ? null : Number(e.target.value))} className="h-6 max-w-[9rem] rounded-ctl border border-line bg-surface px-1 font-mono text-caption">
        {none && <option value="">{none}</option>}
        {Array.from({ length: p.colCount }, (_, c) => (
          <option key={c} value={c}>
            {name(c)}
          </option>
        ))}
      </select>
    </label>
  );
  const data = kind === 'line' ? sortedByX(placed) : placed;
  const fit = kind === 'compare' ? agreement(points) : null;
  // One scale on both axes, so the line of agreement is the diagonal.
  const span = points.length ? [Math.min(...points.map((q) => Math.min(q.x, q.y))), Math.max(...points.map((q) => Math.max(q.x, q.y)))] : [0, 1];
  const chartTitle = `${yTitle} against ${xTitle}`;
  const fileName = `${p.sheetName} ${columnName(yCol)} vs ${columnName(xCol)}`.replace(/[^\w.-]+/g, '-');
  const svg = () => box.current?.querySelector<SVGSVGElement>('svg.recharts-surface') ?? null;
  const [exportProblem, setExportProblem] = useState('');
  const tip = <Tooltip cursor={{ strokeDasharray: '3 3' }} content={<PointTip xTitle={xTitle} yTitle={yTitle} />} isAnimationActive={false} />;
  return (
    <div className="flex flex-col gap-2 p-3" data-testid="chart-panel">
      <div className="flex flex-wrap items-center gap-2 text-caption text-ink-2">
        {columnPicker('X', xCol, (c) => change({ x: c ?? 0 }))}
        {columnPicker('Y', yCol, (c) => change({ y: c ?? 0 }))}
        <select aria-label="Chart type" value={kind} onChange={(e) => change({ kind: e.target.value as ChartKind })} className="h-6 rounded-ctl border border-line bg-surface px-1 text-caption">
          <option value="scatter">points</option>
          <option value="line">line</option>
          <option value="compare">Y against X, with y = x</option>
        </select>
        {columnPicker('Names', spec.label, (c) => change({ label: c }), 'none')}
      </div>
      {points.length === 0 ? (
        <p className="text-ui text-ink-2">
          No {p.filtered ? 'shown ' : ''}row has numbers in both {columnName(xCol)} and {columnName(yCol)}.
        </p>
      ) : (
        <div className="h-72 w-full" ref={box} data-testid="chart-plot">
          <ResponsiveContainer width="100%" height="100%">
            {kind !== 'line' ? (
              <ScatterChart margin={{ top: 8, right: 12, bottom: 18, left: 12 }} accessibilityLayer>
                <CartesianGrid stroke="var(--color-line)" />
                <XAxis type="number" dataKey="px" name={xTitle} domain={kind === 'compare' ? span : ['auto', 'auto']} tick={axisTick} stroke="var(--color-line-strong)" label={axisLabel(xTitle, 'insideBottom')} />
                <YAxis type="number" dataKey="py" name={yTitle} domain={kind === 'compare' ? span : ['auto', 'auto']} tick={axisTick} stroke="var(--color-line-strong)" width={52} label={axisLabel(yTitle, 'insideLeft', -90)} />
                {tip}
                {kind === 'compare' && <ReferenceLine segment={[{ x: span[0], y: span[0] }, { x: span[1], y: span[1] }]} stroke="var(--color-ink-3)" strokeDasharray="4 3" ifOverflow="extendDomain" />}
                <Scatter data={data} fill="var(--color-accent)" isAnimationActive={false} />
              </ScatterChart>
            ) : (
              <LineChart data={data} margin={{ top: 8, right: 12, bottom: 18, left: 12 }}>
                <CartesianGrid stroke="var(--color-line)" />
                <XAxis type="number" dataKey="x" domain={['auto', 'auto']} tick={axisTick} stroke="var(--color-line-strong)" label={axisLabel(xTitle, 'insideBottom')} />
                <YAxis type="number" tick={axisTick} stroke="var(--color-line-strong)" width={52} label={axisLabel(yTitle, 'insideLeft', -90)} />
                {tip}
                <Line dataKey="y" stroke="var(--color-accent)" dot={{ r: 2 }} isAnimationActive={false} />
              </LineChart>
            )}
          </ResponsiveContainer>
        </div>
      )}
      {fit && (
        <p className="text-caption text-ink-2" data-testid="chart-agreement">
          {name(yCol)} − {name(xCol)}: mean {fit.mean.toPrecision(3)}, RMS {fit.rms.toPrecision(3)}; farthest at {fit.worst.name ? `${fit.worst.name}, ` : ''}X = {fit.worst.x.toPrecision(4)}, Y = {fit.worst.y.toPrecision(4)}.
        </p>
      )}
      <p className="text-caption text-ink-3" data-testid="chart-count">
        {points.length} point{points.length === 1 ? '' : 's'}
        {p.filtered ? ' from the rows the filter shows' : ''}
        {skipped > 0 ? `; ${skipped} row${skipped === 1 ? '' : 's'} without two numbers left out` : ''}
        {moved > 0 ? `; ${moved} points that coincide are drawn slightly apart` : ''}.
      </p>
      {points.length > 0 && (
        <div className="flex items-center gap-2 text-caption">
          <button type="button" className="rounded-ctl border border-line px-2 py-0.5 text-ink-2 hover:bg-hover" onClick={() => { const s = svg(); if (s) downloadSvg(s, chartTitle, `${fileName}.svg`); }}>
            Save as SVG
          </button>
          <button
            type="button"
            className="rounded-ctl border border-line px-2 py-0.5 text-ink-2 hover:bg-hover"
            onClick={() => {
              const s = svg();
              if (s) downloadPng(s, chartTitle, `${fileName}.png`).then(() => setExportProblem(''), (e: Error) => setExportProblem(e.message));
            }}
          >
            Save as PNG
          </button>
          {exportProblem && <span className="text-danger">{exportProblem}</span>}
        </div>
      )}
    </div>
  );
}
