// One open live-update stream of a workbook (GET /api/workbooks/:id/events): every committed
// revision, rename, lock and member change, and who is here. The route frames it as Server-Sent
// Events; this file decides what is sent and when: the replay a reconnecting client missed, the
// re-check of session and access before every event and on a timer, and presence.
import { and, asc, eq, gt } from 'drizzle-orm';
import { allowedActions } from '../../shared/permissions.js';
import type { LiveEventName, LiveEvents, PresenceInput } from '../../shared/team.js';
import type { RevisionKind, RevisionPatch, WorkbookEvent } from '../../shared/workbooks.js';
import type { AppContext } from '../context.js';
import { revisions, sheets } from '../db/schema.js';
import { notFound } from '../errors.js';
import type { WorkbookAccess } from './access.js';
import type { LiveConnection, PresenceBoard } from './presence.js';
import { streamVerdict } from './streamGuard.js';

/** Comment lines keep proxies and browsers from closing an idle stream (many cut at 30–60 s; common practice). */
export const heartbeatMs = 25_000;
/** A client that missed more than this many revisions is told to reload instead of being replayed. */
export const maxReplayedRevisions = 500;
/**
 * A stream whose unsent bytes pass this is cut: its reader has stopped reading, and holding every
 * later event for it would grow the server without bound. The client reconnects with Last-Event-ID
 * and is replayed what it missed (or told to reload).
 */
export const maxUnsentBytes = 1024 * 1024;
/** How often an open stream re-checks its session and access, besides before every event. */
export const recheckMs = 500;

/** A live connection as the stream needs it: events, a keep-alive, and whether the reader is gone. */
export interface LiveStreamConnection extends LiveConnection {
  /** A comment line, or cutting a reader that stopped reading. */
  keepAlive(): void;
  readonly gone: boolean;
}

// One data object per published revision, shared by every stream watching the workbook, so the
// connection serialises a large revision once (routes/live.ts), not once per watcher.
const sharedData = new WeakMap<object, LiveEvents['revision']>();

function revisionData(r: { revision: number; kind: RevisionKind; authorId: string | null; patch: RevisionPatch }): LiveEvents['revision'] {
  let data = sharedData.get(r);
  if (!data) sharedData.set(r, (data = revisionDataOf(r)));
  return data;
}

function revisionDataOf(r: { revision: number; kind: RevisionKind; authorId: string | null; patch: RevisionPatch }): LiveEvents['revision'] {
  return { revision: r.revision, kind: r.kind, authorId: r.authorId ?? '', changes: r.patch.changes, sheetOps: r.patch.sheetOps, ...(r.patch.restoredFrom !== undefined ? { restoredFrom: r.patch.restoredFrom } : {}) };
}

/** The revisions after `since`, oldest first, for a client reconnecting with Last-Event-ID. */
function missedRevisions(ctx: AppContext, workbookId: string, since: number) {
  return ctx.db
    .select({ revision: revisions.number, kind: revisions.kind, authorId: revisions.authorId, patch: revisions.patch })
    .from(revisions)
    .where(and(eq(revisions.workbookId, workbookId), gt(revisions.number, since)))
    .orderBy(asc(revisions.number))
    .limit(maxReplayedRevisions + 1)
    .all()
    .map((r) => ({ ...r, kind: r.kind as RevisionKind, patch: r.patch }));
}

export interface LiveStreamOptions {
  access: WorkbookAccess;
  /** The session that opened the stream: its end (sign-out, password change) ends the stream. */
  sessionId: string;
  /** The Last-Event-ID a reconnecting client sent (a revision number), if any. */
  lastEventId?: number;
}

/** Runs one stream until the connection closes; returns what the route calls when it does. */
export function startLiveStream(ctx: AppContext, board: PresenceBoard, connection: LiveStreamConnection, { access, sessionId, lastEventId }: LiveStreamOptions): () => void {
  const workbookId = access.workbook.id;
  const send = <E extends LiveEventName>(event: E, data: LiveEvents[E], id?: number) => connection.send(event, data, id);
  let role = access.role;

  const close = (reason: LiveEvents['closed']['reason']) => {
    send('closed', { reason });
    connection.end();
  };
  // Sign-out, a disabled account, a password change (sessions invalidated) or a demotion end the
  // stream here, before the next event and within `recheckMs`, whichever route made the change.
  const stillAllowed = () => {
    if (connection.gone) return false;
    const verdict = streamVerdict(ctx, sessionId, workbookId);
    if (!verdict.ok) {
      close(verdict.reason);
      return false;
    }
    if (verdict.role !== role) send('role', { role: (role = verdict.role), actions: allowedActions(verdict.roles) });
    return true;
  };
  const onEvent = (event: WorkbookEvent) => {
    if (event.type !== 'deleted' && !stillAllowed()) return;
    switch (event.type) {
      case 'revision':
        return send('revision', revisionData(event), event.revision);
      case 'renamed':
        return send('renamed', { title: event.title });
      case 'deleted':
        return close('deleted');
      case 'protection':
        return send('protection', event.protection);
      case 'members':
        // Someone removed or re-roled mid-stream: stillAllowed() above has already closed the
        // stream or told them their new role, from the session and memberships as they are now.
        return;
    }
  };
  // Subscribing, the first event and any replay happen in one synchronous step: no commit can
  // slip in between, so the client sees every revision after the one `ready` names exactly once.
  const unsubscribe = ctx.events.subscribe(workbookId, onEvent);
  send('ready', { revision: access.workbook.revision, role, actions: allowedActions(access.roles) });
  if (lastEventId !== undefined && Number.isInteger(lastEventId) && lastEventId >= 0 && lastEventId < access.workbook.revision) {
    const missed = missedRevisions(ctx, workbookId, lastEventId);
    if (missed.length > maxReplayedRevisions) send('reload', { revision: access.workbook.revision });
    else for (const r of missed) send('revision', revisionData(r), r.revision);
  }
  board.join(workbookId, connection);
  board.broadcast(workbookId);

  const heartbeat = setInterval(() => connection.keepAlive(), heartbeatMs);
  heartbeat.unref();
  const recheck = setInterval(stillAllowed, recheckMs);
  recheck.unref();
  return () => {
    clearInterval(heartbeat);
    clearInterval(recheck);
    unsubscribe();
    board.leave(workbookId, connection);
    board.broadcast(workbookId);
  };
}

/** Moves the user's cursor to a cell of one of the workbook's sheets and tells everyone watching. */
export function moveCursor(ctx: AppContext, board: PresenceBoard, workbookId: string, userId: string, cell: PresenceInput): void {
  const sheet = ctx.db.select({ id: sheets.id }).from(sheets).where(and(eq(sheets.id, cell.sheetId), eq(sheets.workbookId, workbookId))).get();
  if (!sheet) throw notFound('sheet');
  if (board.moveCursor(workbookId, userId, cell)) board.broadcast(workbookId);
}
