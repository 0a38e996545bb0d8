// A Hückel level ladder: E = α + xβ with β < 0, so bonding levels (x > 0) sit below α. Degenerate
// levels side by side; electrons as arrows; α marked by a dashed line.
import type { HuckelModel } from '@functions/chem/huckel.js';
import { Electrons } from './ElectronArrows.js';
import { ladderLevels, levelLabel } from './huckelLayout.js';

const WIDTH = 420;
const ORBITAL = 26;
const GAP = 6;
const CX = 170;

export function HuckelLadderSvg({ model, electrons, title }: { model: HuckelModel; electrons: number; title: string }) {
  const levels = ladderLevels(model, electrons);
  const xs = levels.map((l) => l.x);
  const span = Math.max(1, Math.max(...xs, 0) - Math.min(...xs, 0));
  const plotPx = Math.min(320, Math.max(140, levels.length * 34));
  const top = 24;
  const xmin = Math.min(...xs, 0);
  // Larger x is lower in energy: y grows with x.
  const y = (x: number) => top + ((x - xmin) / span) * plotPx;
  const height = top + plotPx + 30;
  return (
    <svg role="img" aria-label={title} viewBox={`0 0 ${WIDTH} ${height}`} width="100%" className="select-none" data-testid="huckel-ladder">
      <title>{title}</title>
      <line x1={10} x2={10} y1={top + plotPx} y2={top - 10} className="stroke-line-strong" />
      <path d={`M6 ${top - 4} L10 ${top - 10} L14 ${top - 4}`} className="stroke-line-strong" fill="none" />
      <text x={16} y={top - 2} className="fill-ink-3 font-sans" fontSize={9.5}>
        E
      </text>
      <line x1={20} x2={WIDTH - 10} y1={y(0)} y2={y(0)} className="stroke-line-strong" strokeDasharray="3 3" />
      <text x={24} y={y(0) - 4} className="fill-ink-3 font-mono" fontSize={10}>
        α
      </text>
      {levels.map((l, i) => {
        const n = l.orbitals.length;
        const total = n * ORBITAL + (n - 1) * GAP;
        const x0 = CX - total / 2;
        const colour = l.x > 1e-9 ? 'var(--color-accent)' : l.x < -1e-9 ? 'var(--color-caution)' : 'var(--color-ink-3)';
        return (
          <g key={i} data-level={levelLabel(l.x)}>
            {l.orbitals.map((f, k) => {
              const c = x0 + k * (ORBITAL + GAP) + ORBITAL / 2;
              return (
                <g key={k}>
                  <line x1={c - ORBITAL / 2} x2={c + ORBITAL / 2} y1={y(l.x)} y2={y(l.x)} stroke={colour} strokeWidth={2.2} />
                  <Electrons cx={c} y={y(l.x)} filling={f} />
                </g>
              );
            })}
            <text x={x0 + total + 8} y={y(l.x) + 4} className="fill-ink-2 font-mono" fontSize={12}>
              {levelLabel(l.x)}
            </text>
          </g>
        );
      })}
    </svg>
  );
}
