// A slim line above the grid when the sheet in view is locked or has protected ranges: who locked it,
// when and why, and whether the greyed cells include mine to edit.
import type { Protection } from '../../../shared/team.js';
import { lockSummary } from './SheetLockSection.js';

export function ProtectionBanner({ protection, sheetId, myId, onOpen }: { protection: Protection; sheetId: string; myId: string; onOpen: () => void }) {
  const lock = protection.locks.find((l) => l.sheetId === sheetId);
  const ranges = protection.protectedRanges.filter((r) => r.sheetId === sheetId);
  if (!lock && ranges.length === 0) return null;
  const rangesAgainstMe = ranges.filter((r) => !r.editors.some((e) => e.id === myId));
  return (
    <div role="status" aria-label="Sheet protection" className={`flex items-center gap-3 border-b px-3 py-1 text-caption ${lock ? 'border-caution-line bg-caution-soft text-ink' : 'border-line bg-raised text-ink-2'}`}>
      <LockGlyph />
      <p className="min-w-0 flex-1 truncate" title={lock ? lockSummary(lock, myId) : undefined}>
        {lock ? (
          <>
            {lockSummary(lock, myId)}
          </>
        ) : (
          <>
            {ranges.length === 1 ? `Protected range ${ranges[0].range}` : `${ranges.length} protected ranges (${ranges.map((r) => r.range).join(', ')})`}
            {rangesAgainstMe.length > 0 ? ': greyed cells are read-only for you.' : ranges.length === 1 ? ': you are among those who may edit it.' : ': you are among those who may edit each of them.'}
          </>
        )}
      </p>
      <button type="button" onClick={onOpen} className="shrink-0 font-medium text-accent hover:underline">
        Details
      </button>
    </div>
  );
}

function LockGlyph() {
  return (
    <svg viewBox="0 0 16 16" width="14" height="14" fill="none" stroke="currentColor" strokeWidth="1.5" aria-hidden="true" className="shrink-0 text-caution">
      <rect x="3" y="7" width="10" height="7" rx="1.5" />
      <path d="M5.5 7V5a2.5 2.5 0 0 1 5 0v2" />
    </svg>
  );
}
