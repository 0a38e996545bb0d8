// Our MO level diagram: each atom's valence levels at the sides, the molecular levels in the
// middle, electrons as arrows, dashed lines from the atomic levels that combine. Bonding levels are
// drawn in the accent colour, antibonding ones in the warm caution colour and dashed-outlined,
// non-bonding ones in grey; a legend says so in words as well.
import type { DrawnLevel, MoPicture } from './moLayout.js';
import { Electrons } from './ElectronArrows.js';

const WIDTH = 420;
const SLOT_PX = 40;
const TOP = 34;
const ORBITAL_MO = 26;
const ORBITAL_ATOM = 16;
const GAP = 6;
const X = { left: 84, middle: 204, right: 344 };

const stroke: Record<DrawnLevel['character'], string> = {
  bonding: 'var(--color-accent)',
  antibonding: 'var(--color-caution)',
  nonbonding: 'var(--color-ink-3)',
  atomic: 'var(--color-ink-2)',
};

function span(level: DrawnLevel, cx: number, orbitalPx: number) {
  const n = level.orbitals.length;
  const total = n * orbitalPx + (n - 1) * GAP;
  return { x0: cx - total / 2, x1: cx + total / 2, centres: level.orbitals.map((_, i) => cx - total / 2 + i * (orbitalPx + GAP) + orbitalPx / 2) };
}

function Level({ level, cx, y, orbitalPx, label, labelSide }: { level: DrawnLevel; cx: number; y: number; orbitalPx: number; label: string; labelSide: 'left' | 'right' }) {
  const { x0, x1, centres } = span(level, cx, orbitalPx);
  return (
    <g data-level={label} data-character={level.character}>
      {centres.map((c, i) => (
        <g key={i}>
          <line x1={c - orbitalPx / 2} x2={c + orbitalPx / 2} y1={y} y2={y} stroke={stroke[level.character]} strokeWidth={2.2} strokeDasharray={level.character === 'antibonding' ? '5 2' : undefined} />
          <Electrons cx={c} y={y} filling={level.orbitals[i]} />
        </g>
      ))}
      <text x={labelSide === 'right' ? x1 + 6 : x0 - 6} y={y + 4} textAnchor={labelSide === 'right' ? 'start' : 'end'} className="fill-ink-2 font-mono" fontSize={12}>
        {label}
      </text>
    </g>
  );
}

export function MoDiagramSvg({ picture, title }: { picture: MoPicture; title: string }) {
  const height = TOP + (picture.topSlot + 1) * SLOT_PX + 44;
  const y = (slot: number) => TOP + 12 + (picture.topSlot - slot) * SLOT_PX;
  const sides = { left: picture.left, right: picture.right } as const;
  return (
    <svg role="img" aria-label={title} viewBox={`0 0 ${WIDTH} ${height}`} width="100%" className="select-none" data-testid="mo-diagram">
      <title>{title}</title>
      <text x={X.left} y={16} textAnchor="middle" className="fill-ink font-sans" fontSize={13} fontWeight={600}>
        {picture.left.symbol}
      </text>
      <text x={X.middle} y={16} textAnchor="middle" className="fill-ink-3 font-sans" fontSize={12}>
        molecule
      </text>
      <text x={X.right} y={16} textAnchor="middle" className="fill-ink font-sans" fontSize={13} fontWeight={600}>
        {picture.right.symbol}
      </text>
      <line x1={8} x2={8} y1={TOP} y2={height - 40} className="stroke-line-strong" strokeWidth={1} markerEnd="" />
      <path d={`M4 ${TOP + 6} L8 ${TOP} L12 ${TOP + 6}`} className="stroke-line-strong" fill="none" />
      <text x={14} y={TOP + 4} className="fill-ink-3 font-sans" fontSize={11}>
        E
      </text>
      {picture.links.map((l, i) => {
        const atomic = sides[l.side].levels[l.atomic];
        const mo = picture.molecular[l.molecular];
        if (!atomic || !mo) return null;
        const a = span(atomic, X[l.side], ORBITAL_ATOM);
        const m = span(mo, X.middle, ORBITAL_MO);
        const ax = l.side === 'left' ? a.x1 : a.x0;
        const mx = l.side === 'left' ? m.x0 : m.x1;
        return <line key={i} x1={ax} y1={y(atomic.slot)} x2={mx} y2={y(mo.slot)} className="stroke-line-strong" strokeWidth={0.9} strokeDasharray="2 3" />;
      })}
      {picture.left.levels.map((l, i) => (
        <Level key={`l${i}`} level={l} cx={X.left} y={y(l.slot)} orbitalPx={ORBITAL_ATOM} label={l.label} labelSide="left" />
      ))}
      {picture.right.levels.map((l, i) => (
        <Level key={`r${i}`} level={l} cx={X.right} y={y(l.slot)} orbitalPx={ORBITAL_ATOM} label={l.label} labelSide="right" />
      ))}
      {picture.molecular.map((l, i) => (
        <Level key={`m${i}`} level={l} cx={X.middle} y={y(l.slot)} orbitalPx={ORBITAL_MO} label={l.label} labelSide="right" />
      ))}
      <g transform={`translate(24 ${height - 16})`} className="font-sans" fontSize={12}>
        {(['bonding', 'antibonding', 'nonbonding'] as const).map((c, i) => (
          <g key={c} transform={`translate(${i * 128} 0)`}>
            <line x1={0} x2={18} y1={0} y2={0} stroke={stroke[c]} strokeWidth={2.2} strokeDasharray={c === 'antibonding' ? '5 2' : undefined} />
            <text x={23} y={3.5} className="fill-ink-2">
              {c === 'nonbonding' ? 'non-bonding' : c}
            </text>
          </g>
        ))}
      </g>
    </svg>
  );
}
