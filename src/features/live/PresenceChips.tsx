// Who else has the workbook open and which cell they are on, as small initials chips, plus whether
// this page is receiving live updates at all.
import type { PresenceUser } from '../../../shared/team.js';
import { cellName } from '../../../shared/a1.js';
import type { LiveConnection } from './useLiveUpdates.js';

function initials(name: string) {
  const parts = name.trim().split(/\s+/);
  return ((parts[0]?.[0] ?? '') + (parts.length > 1 ? parts[parts.length - 1][0] : '')).toUpperCase() || '?';
}

const connectionLabels: Record<LiveConnection, string> = {
  connecting: 'Connecting…',
  live: 'Live',
  reconnecting: 'Reconnecting…',
  ended: 'Not live',
};

export function PresenceChips({
  users,
  myId,
  connection,
  activeSheetId,
  sheetName,
}: {
  users: PresenceUser[];
  myId: string;
  connection: LiveConnection;
  activeSheetId: string;
  sheetName: (sheetId: string) => string | null;
}) {
  const others = users.filter((u) => u.userId !== myId);
  const where = (u: PresenceUser) => {
    if (!u.cell) return null;
    const name = sheetName(u.cell.sheetId);
    if (name === null) return null;
    const cell = cellName(u.cell.row, u.cell.col);
    return u.cell.sheetId === activeSheetId ? cell : `${name}!${cell}`;
  };
  return (
    <div className="flex items-center gap-2">
      <span
        data-testid="live-state"
        data-state={connection}
        className={`flex items-center gap-1 text-caption ${connection === 'live' ? 'text-ok' : connection === 'ended' ? 'text-danger' : 'text-caution'}`}
        title={connection === 'live' ? 'Colleagues’ changes appear here as they save them' : undefined}
      >
        <span aria-hidden="true" className="size-1.5 rounded-full bg-current" />
        {connectionLabels[connection]}
      </span>
      {others.length > 0 && (
        <ul aria-label="Also here" className="flex items-center gap-1">
          {others.map((u) => {
            const at = where(u);
            return (
              <li
                key={u.userId}
                aria-label={`${u.name}${at ? ` on ${at}` : ''}`}
                title={`${u.name}${at ? ` — on ${at}` : ' — here'}`}
                className="flex h-6 items-center gap-1 rounded-full border border-accent-line bg-accent-soft pr-2 pl-0.5 text-caption text-ink"
              >
                <span aria-hidden="true" className="flex size-5 items-center justify-center rounded-full bg-accent text-[10px] font-semibold text-on-accent">
                  {initials(u.name)}
                </span>
                <span className="max-w-24 truncate">{u.name.split(/\s+/)[0]}</span>
                {at && <span className="font-mono text-ink-3">{at}</span>}
              </li>
            );
          })}
        </ul>
      )}
    </div>
  );
}
