// Electrons on one orbital line: ↑ for a single electron, ↑↓ for a pair (opposite spins).
import type { OrbitalFilling } from './moLayout.js';

function Arrow({ x, y, up }: { x: number; y: number; up: boolean }) {
  const tip = up ? y - 11 : y + 9;
  const tail = up ? y + 9 : y - 11;
  const head = up ? 4 : -4;
  return <path d={`M${x} ${tail} L${x} ${tip} M${x - 3} ${tip + head} L${x} ${tip} L${x + 3} ${tip + head}`} className="stroke-ink" strokeWidth={1.4} fill="none" strokeLinecap="round" />;
}

export function Electrons({ cx, y, filling }: { cx: number; y: number; filling: OrbitalFilling }) {
  if (filling === 0) return null;
  if (filling === 1) return <Arrow x={cx} y={y} up />;
  return (
    <>
      <Arrow x={cx - 4} y={y} up />
      <Arrow x={cx + 4} y={y} up={false} />
    </>
  );
}
