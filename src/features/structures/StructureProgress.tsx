// "EHT: 120 of 1,000 structures": how far the server has got with the open workbook's structures.
// Shown only while some are still on their way, so a finished workbook has no extra line.
import { useSyncExternalStore } from 'react';
import type { StructureStore } from '../../core/workbook/structures/structureStore.js';

export function StructureProgress({ store }: { store: StructureStore }) {
  const progress = useSyncExternalStore(
    (cb) => store.subscribe(cb),
    () => store.progress,
  );
  if (progress.done >= progress.total && !progress.problem) return null;
  const n = (x: number) => x.toLocaleString('en');
  return (
    <div role="status" aria-live="polite" data-testid="structure-progress" className="border-b border-line bg-panel px-3 py-1 text-ui text-ink-2">
      <span>
        Extended Hückel: {n(progress.done)} of {n(progress.total)} structures computed on the server
      </span>
      <progress className="ml-2 h-1.5 w-32 align-middle" max={Math.max(progress.total, 1)} value={progress.done} aria-label="structures computed" />
      {progress.problem && <span className="ml-2 text-caution">— {progress.problem}; asking again shortly</span>}
    </div>
  );
}
