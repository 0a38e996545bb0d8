// GET /api/workbooks/:id/events: Server-Sent Events (the WHATWG HTML "server-sent events" format) for
// one workbook, and POST /api/workbooks/:id/presence to move one's cursor. Any member (viewers too)
// may listen. This file frames the stream over HTTP; what is sent and when is services/liveStream.ts.
// The event names and payloads are LiveEvents in shared/team.ts.
import { Router, type Response } from 'express';
import { presenceSchema } from '../../shared/team.js';
import { currentSession, currentUser, requireUser } from '../auth/middleware.js';
import type { AppContext } from '../context.js';
import { parse } from '../errors.js';
import { maxUnsentBytes, moveCursor, startLiveStream, type LiveStreamConnection } from '../services/liveStream.js';
import { PresenceBoard } from '../services/presence.js';
import { accessMiddleware, accessOf } from './access.js';

// The JSON of each revision's data, kept while the data object lives: every stream watching a
// workbook gets the same object (services/liveStream.ts), and a 30,000-cell revision takes a while to
// serialise. Only revisions: their data is never changed once published.
const serialised = new WeakMap<object, string>();
function json(event: string, data: unknown): string {
  if (event !== 'revision' || typeof data !== 'object' || data === null) return JSON.stringify(data);
  let text = serialised.get(data);
  if (text === undefined) serialised.set(data, (text = JSON.stringify(data)));
  return text;
}

function openStream(res: Response, user: { id: string; name: string }): LiveStreamConnection {
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
    get gone() {
      return res.writableEnded || res.destroyed;
    },
    send(event, data, id) {
      if (res.writableEnded || res.destroyed) return;
      if (res.writableLength > maxUnsentBytes) {
        res.destroy();
        return;
      }
      res.write(`${id !== undefined ? `id: ${id}\n` : ''}event: ${event}\ndata: ${json(event, data)}\n\n`);
    },
    keepAlive() {
      if (res.writableLength > maxUnsentBytes) res.destroy();
      else if (!res.writableEnded && !res.destroyed) res.write(': keep-alive\n\n');
    },
    end() {
      if (!res.writableEnded) res.end();
    },
  };
}

export function liveRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(requireUser);
  const access = accessMiddleware(ctx);
  const board = new PresenceBoard();

  router.get('/:id/events', access('view'), (req, res) => {
    const lastEventId = req.get('last-event-id');
    const connection = openStream(res, currentUser(res));
    const stop = startLiveStream(ctx, board, connection, { access: accessOf(res), sessionId: currentSession(res).id, lastEventId: lastEventId === undefined ? undefined : Number(lastEventId) });
    res.on('close', stop);
  });

  router.post('/:id/presence', access('view'), (req, res) => {
    const cell = parse(presenceSchema, req.body);
    moveCursor(ctx, board, accessOf(res).workbook.id, currentUser(res).id, cell);
    res.status(204).end();
  });

  return router;
}
