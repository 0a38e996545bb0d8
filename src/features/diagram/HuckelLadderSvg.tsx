// A Hückel level ladder: E = α + xβ with β < 0, so bonding levels (x > 0) sit below α. Degenerate
// levels side by side; electrons as arrows; α marked by a dashed line.
import type { HuckelModel } from '@functions/chem/huckel.js';
import { Electrons } from './ElectronArrows.js';
import { ladderLevels, levelLabel, separateLabels } from './huckelLayout.js';

const WIDTH = 420;
const ORBITAL = 26;
const GAP = 6;
const CX = 170;
/** Closest two levels are drawn: the electron arrows span 20 units (ElectronArrows), labels 12. */
const LEVEL_GAP = 24;

export function HuckelLadderSvg({ model, electrons, title }: { model: HuckelModel; electrons: number; title: string }) {
  const levels = ladderLevels(model, electrons);
  const xs = levels.map((l) => l.x);
  const span = Math.max(1, Math.max(...xs, 0) - Math.min(...xs, 0));
  const plotPx = Math.min(320, Math.max(140, levels.length * 34));
  const top = 24;
  const xmin = Math.min(...xs, 0);
  // Larger x is lower in energy: y grows with x.
  const y = (x: number) => top + ((x - xmin) / span) * plotPx;
  // Nearly equal levels (pyridine's α + β and α + 1.167β) are set apart so their arrows and labels
  // stay readable; the labels carry the exact energies.
  const levelY = separateLabels(
    levels.map((l) => y(l.x)),
    LEVEL_GAP,
  );
  const moved = levels.some((l, i) => Math.abs(levelY[i] - y(l.x)) > 0.5);
  const height = Math.max(top + plotPx + 30, Math.max(...levelY) + 16) + (moved ? 14 : 0);
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
                  <line x1={c - ORBITAL / 2} x2={c + ORBITAL / 2} y1={levelY[i]} y2={levelY[i]} stroke={colour} strokeWidth={2.2} />
                  <Electrons cx={c} y={levelY[i]} filling={f} />
                </g>
              );
            })}
            <text x={x0 + total + 8} y={levelY[i] + 4} className="fill-ink-2 font-mono" fontSize={12}>
              {levelLabel(l.x)}
            </text>
          </g>
        );
      })}
      {moved && (
        <text x={20} y={height - 6} className="fill-ink-3 font-sans" fontSize={10}>
          Levels closer than their arrows are drawn apart; the labels give each energy.
        </text>
      )}
    </svg>
  );
}
