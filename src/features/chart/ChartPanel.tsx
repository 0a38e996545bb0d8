// Plots two columns of the sheet against each other, as points, as a line, or as predicted (Y)
// against measured (X) with the line of agreement y = x and how far the two lie apart (recharts).
import { useMemo, useState } from 'react';
import { CartesianGrid, Line, LineChart, ReferenceLine, ResponsiveContainer, Scatter, ScatterChart, Tooltip, XAxis, YAxis } from 'recharts';
import { columnName } from '@shared/a1.js';
import type { RowData } from '../../core/workbook/model/workbookModel.js';
import { agreement, numericPairs, sortedByX } from './chartData.js';

export function ChartPanel({ rows, colCount, firstRow, headerRow, initialX }: { rows: RowData[]; colCount: number; firstRow: number; headerRow: RowData | null; initialX: number }) {
  const [xCol, setX] = useState(initialX);
  const [yCol, setY] = useState(initialX + 1);
  const [kind, setKind] = useState<'scatter' | 'line' | 'compare'>('scatter');
  const { points, skipped } = useMemo(() => numericPairs(rows, xCol, yCol, firstRow), [rows, xCol, yCol, firstRow]);
  const name = (c: number) => {
    const title = headerRow?.[c]?.display;
    return title ? `${columnName(c)} · ${title}` : columnName(c);
  };
  const columnPicker = (label: string, value: number, set: (c: number) => void) => (
    <label className="flex items-center gap-1">
      {label}
      <select aria-label={`${label} column`} value={value} onChange={(e) => set(Number(e.target.value))} className="h-6 rounded-ctl border border-line bg-surface px-1 font-mono text-caption">
        {Array.from({ length: colCount }, (_, c) => (
          <option key={c} value={c}>
            {name(c)}
          </option>
        ))}
      </select>
    </label>
  );
  const data = kind === 'line' ? sortedByX(points) : points;
  const fit = kind === 'compare' ? agreement(points) : null;
  // One scale on both axes, so the line of agreement is the diagonal.
  const span = points.length ? [Math.min(...points.map((p) => Math.min(p.x, p.y))), Math.max(...points.map((p) => Math.max(p.x, p.y)))] : [0, 1];
  return (
    <div className="flex flex-col gap-2 p-3" data-testid="chart-panel">
      <div className="flex flex-wrap items-center gap-2 text-caption text-ink-2">
        {columnPicker('X', xCol, setX)}
        {columnPicker('Y', yCol, setY)}
        <select aria-label="Chart type" value={kind} onChange={(e) => setKind(e.target.value as 'scatter' | 'line' | 'compare')} className="h-6 rounded-ctl border border-line bg-surface px-1 text-caption">
          <option value="scatter">points</option>
          <option value="line">line</option>
          <option value="compare">Y against X, with y = x</option>
        </select>
      </div>
      {points.length === 0 ? (
        <p className="text-ui text-ink-2">No row has numbers in both {columnName(xCol)} and {columnName(yCol)}.</p>
      ) : (
        <div className="h-64 w-full">
          <ResponsiveContainer width="100%" height="100%">
            {kind !== 'line' ? (
              <ScatterChart margin={{ top: 8, right: 12, bottom: 8, left: 0 }}>
                <CartesianGrid stroke="var(--color-line)" />
                <XAxis type="number" dataKey="x" name={name(xCol)} domain={kind === 'compare' ? span : ['auto', 'auto']} tick={{ fontSize: 11, fill: 'var(--color-ink-3)' }} stroke="var(--color-line-strong)" />
                <YAxis type="number" dataKey="y" name={name(yCol)} domain={kind === 'compare' ? span : ['auto', 'auto']} tick={{ fontSize: 11, fill: 'var(--color-ink-3)' }} stroke="var(--color-line-strong)" width={44} />
                <Tooltip cursor={{ strokeDasharray: '3 3' }} />
                {kind === 'compare' && <ReferenceLine segment={[{ x: span[0], y: span[0] }, { x: span[1], y: span[1] }]} stroke="var(--color-ink-3)" strokeDasharray="4 3" ifOverflow="extendDomain" />}
                <Scatter data={data} fill="var(--color-accent)" isAnimationActive={false} />
              </ScatterChart>
            ) : (
              <LineChart data={data} margin={{ top: 8, right: 12, bottom: 8, left: 0 }}>
                <CartesianGrid stroke="var(--color-line)" />
                <XAxis type="number" dataKey="x" domain={['auto', 'auto']} tick={{ fontSize: 11, fill: 'var(--color-ink-3)' }} stroke="var(--color-line-strong)" />
                <YAxis type="number" tick={{ fontSize: 11, fill: 'var(--color-ink-3)' }} stroke="var(--color-line-strong)" width={44} />
                <Tooltip />
                <Line dataKey="y" stroke="var(--color-accent)" dot={{ r: 2 }} isAnimationActive={false} />
              </LineChart>
            )}
          </ResponsiveContainer>
        </div>
      )}
      {fit && (
        <p className="text-caption text-ink-2" data-testid="chart-agreement">
          {name(yCol)} − {name(xCol)}: mean {fit.mean.toPrecision(3)}, RMS {fit.rms.toPrecision(3)}; farthest at X = {fit.worst.x.toPrecision(4)}, Y = {fit.worst.y.toPrecision(4)}.
        </p>
      )}
      <p className="text-caption text-ink-3">
        {points.length} point{points.length === 1 ? '' : 's'}
        {skipped > 0 ? `; ${skipped} row${skipped === 1 ? '' : 's'} without two numbers left out` : ''}.
      </p>
    </div>
  );
}
