// Predicted π→π* bands of a π system as sticks on a wavelength axis (PPP-CIS singlets from
// functions/chem/ppp.ts): stick height is the oscillator strength relative to the strongest band
// shown; behind them, the bands broadened into a curve with a width the user sets.
import { useId, useState } from 'react';
import type { ExcitedState } from '@functions/chem/ppp.js';
import { broadenedSpectrum } from './spectrumCurve.js';

const WIDTH = 420;
const HEIGHT = 120;
const LEFT = 24;
const RIGHT = WIDTH - 12;
const BASE = HEIGHT - 22;
const TOP = 12;
const MIN_NM = 180;
const MAX_NM = 800;

const GRID_NM = Array.from({ length: (MAX_NM - MIN_NM) / 2 + 1 }, (_, i) => MIN_NM + 2 * i);

/** The spectrum with its band-width control (full width at half maximum, eV). */
export function PppSpectrumView({ states, title }: { states: ExcitedState[]; title: string }) {
  const [widthEv, setWidthEv] = useState(0.3);
  const id = useId();
  return (
    <div>
      <PppSpectrumSvg states={states} title={title} widthEv={widthEv} />
      <label htmlFor={id} className="flex items-center gap-2 text-caption text-ink-3">
        Band width (FWHM)
        <input id={id} type="range" min={0.05} max={1} step={0.05} value={widthEv} onChange={(e) => setWidthEv(Number(e.target.value))} className="flex-1" />
        <span className="w-16 shrink-0 text-right font-mono text-ink-2">{widthEv.toFixed(2)} eV</span>
      </label>
    </div>
  );
}

export function PppSpectrumSvg({ states, title, widthEv }: { states: ExcitedState[]; title: string; widthEv: number }) {
  const shown = states.filter((s) => s.wavelength >= MIN_NM && s.wavelength <= MAX_NM);
  const strongest = Math.max(1e-6, ...shown.map((s) => s.f));
  const x = (nm: number) => LEFT + ((nm - MIN_NM) / (MAX_NM - MIN_NM)) * (RIGHT - LEFT);
  const ticks = [200, 300, 400, 500, 600, 700, 800];
  // Every band counts toward the curve (one just outside the axis still has a shoulder inside it).
  const curve = broadenedSpectrum(states, widthEv, GRID_NM);
  const curveMax = Math.max(...curve);
  const curvePath = curveMax > 0 ? GRID_NM.map((nm, i) => `${i ? 'L' : 'M'}${x(nm).toFixed(1)},${(BASE - (curve[i] / curveMax) * (BASE - TOP)).toFixed(1)}`).join('') : '';
  return (
    <svg role="img" aria-label={title} viewBox={`0 0 ${WIDTH} ${HEIGHT}`} width="100%" className="select-none" data-testid="ppp-spectrum">
      <title>{title}</title>
      <line x1={LEFT} x2={RIGHT} y1={BASE} y2={BASE} className="stroke-line-strong" />
      {ticks.map((t) => (
        <g key={t}>
          <line x1={x(t)} x2={x(t)} y1={BASE} y2={BASE + 4} className="stroke-line-strong" />
          <text x={x(t)} y={BASE + 15} textAnchor="middle" className="fill-ink-3 font-mono" fontSize={9}>
            {t}
          </text>
        </g>
      ))}
      <text x={RIGHT} y={TOP - 2} textAnchor="end" className="fill-ink-3 font-sans" fontSize={9}>
        nm
      </text>
      {curvePath && <path d={curvePath} fill="none" stroke="var(--color-ink-3)" strokeWidth={1.2} data-testid="ppp-curve" data-width-ev={widthEv} />}
      {shown.map((s, i) => {
        // Forbidden bands (f ≈ 0) still get a short dashed stick so their position shows.
        const h = s.f / strongest > 0.02 ? (s.f / strongest) * (BASE - TOP) : 8;
        return (
          <line
            key={i}
            x1={x(s.wavelength)}
            x2={x(s.wavelength)}
            y1={BASE}
            y2={BASE - h}
            stroke="var(--color-accent)"
            strokeWidth={2}
            strokeDasharray={s.f / strongest > 0.02 ? undefined : '2 2'}
            data-nm={Math.round(s.wavelength)}
          >
            <title>{`${Math.round(s.wavelength)} nm, ${s.energy.toFixed(2)} eV, f = ${s.f.toFixed(3)}, ${s.leading}`}</title>
          </line>
        );
      })}
    </svg>
  );
}
