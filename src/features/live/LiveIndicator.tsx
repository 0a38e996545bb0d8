// Whether this page receives live updates, and how many colleagues have the workbook open; who they
// are and where they are is on the team board.
import type { PresenceUser } from '@shared/team.js';
import type { LiveConnection } from './useLiveUpdates.js';

const connectionLabels: Record<LiveConnection, string> = {
  connecting: 'Connecting…',
  live: 'Live',
  reconnecting: 'Reconnecting…',
  ended: 'Not live',
};

export function LiveIndicator({ users, myId, connection, onShowTeam }: { users: PresenceUser[]; myId: string; connection: LiveConnection; onShowTeam?: () => void }) {
  const others = users.filter((u) => u.userId !== myId);
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
        <button
          type="button"
          data-testid="also-here"
          onClick={onShowTeam}
          title={`${others.map((u) => u.name).join(', ')} — see where on the team board`}
          className="rounded-ctl px-1 text-caption text-ink-2 hover:bg-hover hover:text-ink"
        >
          +{others.length} here
        </button>
      )}
    </div>
  );
}
