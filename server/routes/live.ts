// GET /api/workbooks/:id/events: Server-Sent Events (the WHATWG HTML "server-sent events" format) for
// one workbook: every committed revision, lock and member change, and who is here; and
// POST /api/workbooks/:id/presence to move one's cursor. Any member (viewers too) may listen.
// The event names and payloads are LiveEvents in shared/team.ts.
import { and, asc, eq, gt } from 'drizzle-orm';
import { Router, type Response } from 'express';
import { allowedActions } from '../../shared/permissions.js';
import { presenceSchema, type LiveEventName, type LiveEvents } from '../../shared/team.js';
import type { RevisionKind, RevisionPatch, WorkbookEvent } from '../../shared/workbooks.js';
import { currentSession, currentUser, requireUser } from '../auth/middleware.js';
import type { AppContext } from '../context.js';
import { revisions, sheets } from '../db/schema.js';
import { notFound, parse } from '../errors.js';
import { PresenceBoard, type LiveConnection } from '../services/presence.js';
import { streamVerdict } from '../services/streamGuard.js';
import { workbookAccess } from './workbookAccess.js';

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

function revisionData(r: { revision: number; kind: RevisionKind; authorId: string | null; patch: RevisionPatch }): LiveEvents['revision'] {
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

function openStream(res: Response, user: { id: string; name: string }): LiveConnection {
  res.status(200).set({
    'Content-Type': 'text/event-stream; charset=utf-8',
    'Cache-Control': 'no-cache, no-transform',
    Connection: 'keep-alive',
    'X-Accel-Buffering': 'no', // a buffering reverse proxy would hold events back
  });
  res.flushHeaders();
  res.write('retry: 3000\n\n');
  return {
    userId: user.id,
    name: user.name,
    send(event, data, id) {
      if (res.writableEnded || res.destroyed) return;
      if (res.writableLength > maxUnsentBytes) {
        res.destroy();
        return;
      }
      res.write(`${id !== undefined ? `id: ${id}\n` : ''}event: ${event}\ndata: ${JSON.stringify(data)}\n\n`);
    },
    end() {
      if (!res.writableEnded) res.end();
    },
  };
}

export function liveRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(requireUser);
  const access = workbookAccess(ctx);
  const board = new PresenceBoard();

  router.get('/:id/events', (req, res) => {
    const a = access(req, res, 'view');
    const user = currentUser(res);
    const sessionId = currentSession(res).id;
    const workbookId = a.workbook.id;
    const connection = openStream(res, user);
    const send = <E extends LiveEventName>(event: E, data: LiveEvents[E], id?: number) => connection.send(event, data, id);
    let role = a.role;

    const close = (reason: LiveEvents['closed']['reason']) => {
      send('closed', { reason });
      connection.end();
    };
    // Sign-out, a disabled account, a password change (sessions invalidated) or a demotion end the
    // stream here, before the next event and within `recheckMs`, whichever route made the change.
    const stillAllowed = () => {
      if (res.writableEnded || res.destroyed) return false;
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
    send('ready', { revision: a.workbook.revision, role, actions: allowedActions(a.roles) });
    const lastEventId = Number(req.get('last-event-id'));
    if (Number.isInteger(lastEventId) && lastEventId >= 0 && lastEventId < a.workbook.revision) {
      const missed = missedRevisions(ctx, workbookId, lastEventId);
      if (missed.length > maxReplayedRevisions) send('reload', { revision: a.workbook.revision });
      else for (const r of missed) send('revision', revisionData(r), r.revision);
    }
    board.join(workbookId, connection);
    board.broadcast(workbookId);

    const heartbeat = setInterval(() => {
      if (res.writableLength > maxUnsentBytes) res.destroy();
      else if (!res.writableEnded && !res.destroyed) res.write(': keep-alive\n\n');
    }, heartbeatMs);
    heartbeat.unref();
    const recheck = setInterval(stillAllowed, recheckMs);
    recheck.unref();
    res.on('close', () => {
      clearInterval(heartbeat);
      clearInterval(recheck);
      unsubscribe();
      board.leave(workbookId, connection);
      board.broadcast(workbookId);
    });
  });

  router.post('/:id/presence', (req, res) => {
    const a = access(req, res, 'view');
    const cell = parse(presenceSchema, req.body);
    const sheet = ctx.db.select({ id: sheets.id }).from(sheets).where(and(eq(sheets.id, cell.sheetId), eq(sheets.workbookId, a.workbook.id))).get();
    if (!sheet) throw notFound('sheet');
    if (board.moveCursor(a.workbook.id, currentUser(res).id, cell)) board.broadcast(a.workbook.id);
    res.status(204).end();
  });

  return router;
}
