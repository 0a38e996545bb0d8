// The workbook's Server-Sent Events stream (GET /api/workbooks/:id/events; LiveEvents in
// shared/team.ts): colleagues' revisions go into this engine and grid as they commit, presence and
// protection replace what is shown, a role change takes effect at once. EventSource reconnects by
// itself and sends Last-Event-ID, so the server replays what was missed; RevisionFeed drops repeats.
import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useRef, useState } from 'react';
import type { AccessRole, WorkbookAction } from '@shared/permissions.js';
import type { LiveEventName, LiveEvents, PresenceUser } from '@shared/team.js';
import { queryKeys } from '../../lib/api.js';
import type { WorkbookSession } from '../../core/workbook/session/useWorkbookSession.js';
import { revisionDetailQueryOptions } from '../../core/workbook/revisions.js';
import { setProtection } from '../../core/team/protection.js';
import type { SetAsideInput } from './conflictResolution.js';
import { applyRemoteRevision, fromRevisionDetail } from './remoteRevision.js';
import { RevisionFeed } from './revisionFeed.js';
import { workbookPath } from '@shared/workbooks.js';

export type LiveConnection = 'connecting' | 'live' | 'reconnecting' | 'ended';
export type EndReason = LiveEvents['closed']['reason'] | 'too_far_behind' | 'refused';

export interface LiveState {
  connection: LiveConnection;
  presence: PresenceUser[];
  /** Why the stream ended for good (the page should say so and offer a way on). */
  ended: EndReason | null;
  /** Bumped on every successful (re)connect, so the cursor can be sent again. */
  connects: number;
}

export interface LiveOptions {
  /** The revision the session's engine was built from. */
  loadedRevision: number;
  onRole: (access: { role: AccessRole; actions: WorkbookAction[] }) => void;
  /** My unsent inputs that a colleague's tab deletion left with nowhere to go. */
  onOrphaned: (inputs: SetAsideInput[]) => void;
}

export function useLiveUpdates(session: WorkbookSession, opts: LiveOptions): LiveState {
  const queryClient = useQueryClient();
  const [state, setState] = useState<LiveState>({ connection: 'connecting', presence: [], ended: null, connects: 0 });
  const { model, queue } = session;
  const workbookId = model.id;
  // Callbacks may change identity between renders; the stream is opened once per session.
  const handlers = useRef(opts);
  handlers.current = opts;

  useEffect(() => {
    const end = (reason: EndReason) => {
      // Without the stream, revisions can still be fetched one by one when the save queue needs them
      // to move its base on; after the others the page must be reloaded anyway.
      if (reason !== 'refused') {
        feed.stop();
        queue.catchUp = null;
      }
      source.close();
      setState((s) => ({ ...s, connection: 'ended', ended: reason, presence: [] }));
    };
    const feed = new RevisionFeed({
      start: handlers.current.loadedRevision,
      fetchRevision: (n) => queryClient.fetchQuery(revisionDetailQueryOptions(workbookId, n)).then(fromRevisionDetail),
      onTooFarBehind: () => end('too_far_behind'),
      apply: (rev) => {
        const result = applyRemoteRevision(model, queue, rev);
        // An open History dialog lists it at once (a closed one refetches when opened anyway).
        void queryClient.invalidateQueries({ queryKey: queryKeys.revisions(workbookId), exact: true });
        if (result.orphaned.length > 0) {
          const at = Date.now();
          handlers.current.onOrphaned(result.orphaned.map((c) => ({ ...c, replacedBy: '(sheet deleted)', at })));
        }
      },
    });
    queue.catchUp = (revision) => feed.catchUp(revision);

    const source = new EventSource(`/api${workbookPath(workbookId, 'events')}`);
    let opened = 0;
    const on = <E extends LiveEventName>(name: E, handle: (data: LiveEvents[E]) => void) =>
      source.addEventListener(name, (e) => {
        try {
          handle(JSON.parse((e as MessageEvent<string>).data) as LiveEvents[E]);
        } catch (error) {
          console.error(`live event "${name}" could not be applied`, error);
        }
      });

    on('ready', ({ revision, role, actions }) => {
      // After a reconnect, lock and range changes made meanwhile were not replayed: ask again.
      if (opened++ > 0) void queryClient.invalidateQueries({ queryKey: queryKeys.protection(workbookId) });
      if (role !== model.role || actions.join() !== model.actions.join()) handlers.current.onRole({ role, actions });
      feed.catchUp(revision);
      setState((s) => ({ ...s, connection: 'live', connects: s.connects + 1 }));
    });
    on('revision', (rev) => feed.receive(rev));
    on('presence', ({ users }) => setState((s) => ({ ...s, presence: users })));
    on('protection', (protection) => setProtection(queryClient, workbookId, protection));
    on('role', (access) => handlers.current.onRole(access));
    on('renamed', ({ title }) => {
      model.title = title;
      model.notify();
    });
    on('reload', () => end('too_far_behind'));
    on('closed', ({ reason }) => end(reason));
    source.onerror = () => {
      // CONNECTING: the browser retries by itself (the server asked for 3 s). CLOSED: it was refused
      // (403/404 at connect time) and will not retry.
      if (source.readyState === EventSource.CLOSED) end('refused');
      else setState((s) => (s.connection === 'ended' ? s : { ...s, connection: 'reconnecting', presence: [] }));
    };
    return () => {
      feed.stop();
      source.close();
      queue.catchUp = null;
    };
  }, [model, queue, workbookId, queryClient, handlers]);

  return state;
}
