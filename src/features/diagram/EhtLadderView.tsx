// The extended-Hückel level ladder of the selected structure: each level's energy on a scale, its
// electrons, and which atoms' orbitals make it up. Results come from the server (pending until then).
import type { EhtSummary } from '@functions/chem/ehtSummary.js';
import { ehtLadder } from './ehtLayout.js';

const round = (x: number, places = 2) => (Math.round(x * 10 ** places) / 10 ** places).toFixed(places);
const arrows = (n: number) => (n >= 2 ? '↑↓' : n > 0 ? '↑' : '');

export function EhtLadderView({ summary, title }: { summary: EhtSummary; title: string }) {
  const ladder = ehtLadder(summary);
  const energies = ladder.rows.map((r) => r.energyEv);
  const top = Math.max(...energies);
  const span = Math.max(1e-6, top - Math.min(...energies));
  return (
    <div aria-label={title} data-testid="eht-ladder" className="text-caption">
      {ladder.hiddenAbove > 0 && <p className="text-ink-3">{ladder.hiddenAbove} higher empty levels not shown</p>}
      <ol className="flex flex-col">
        {ladder.rows.map((r) => (
          <li key={r.level} className="grid grid-cols-[4.5rem_3rem_2rem_1fr] items-center gap-2 border-b border-line py-0.5" data-level={r.level} data-role={r.role ?? undefined}>
            <span className="text-right font-mono text-ink">{round(r.energyEv)} eV</span>
            {/* A bar whose left offset follows the energy: the ladder's rungs, lowest at the right. */}
            <span className="relative h-2">
              <span className={`absolute top-0.5 h-0.5 w-3 ${r.electrons > 0 ? 'bg-accent' : 'bg-ink-3'}`} style={{ left: `${((top - r.energyEv) / span) * 75}%` }} />
            </span>
            <span className="font-mono text-ink">{arrows(r.electrons)}</span>
            <span className="truncate font-mono text-ink-2" title={r.makeup}>
              {r.role && <b className="mr-1 text-ink">{r.role}</b>}
              {r.makeup}
            </span>
          </li>
        ))}
      </ol>
      {ladder.hiddenBelow > 0 && <p className="text-ink-3">{ladder.hiddenBelow} lower filled levels not shown</p>}
    </div>
  );
}
