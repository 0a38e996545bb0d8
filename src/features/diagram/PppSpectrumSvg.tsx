// Predicted π→π* bands of a π system as sticks on a wavelength axis (PPP-CIS singlets from
// functions/chem/ppp.ts): stick height is the oscillator strength relative to the strongest band shown.
import type { ExcitedState } from '../../../functions/chem/ppp.js';

const WIDTH = 420;
const HEIGHT = 120;
const LEFT = 24;
const RIGHT = WIDTH - 12;
const BASE = HEIGHT - 22;
const TOP = 12;
const MIN_NM = 180;
const MAX_NM = 800;

export function PppSpectrumSvg({ states, title }: { states: ExcitedState[]; title: string }) {
  const shown = states.filter((s) => s.wavelength >= MIN_NM && s.wavelength <= MAX_NM);
  const strongest = Math.max(1e-6, ...shown.map((s) => s.f));
  const x = (nm: number) => LEFT + ((nm - MIN_NM) / (MAX_NM - MIN_NM)) * (RIGHT - LEFT);
  const ticks = [200, 300, 400, 500, 600, 700, 800];
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
