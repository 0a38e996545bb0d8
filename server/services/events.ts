// An in-process hub for workbook events: the store publishes after each commit, the live-updates
// route (Server-Sent Events) subscribes. One process only; several servers would need a broker.
import type { WorkbookEvent } from '../../shared/workbooks.js';

export type WorkbookListener = (event: WorkbookEvent) => void;

export interface EventHub {
  /** Returns the function that unsubscribes. */
  subscribe(workbookId: string, listener: WorkbookListener): () => void;
  publish(workbookId: string, event: WorkbookEvent): void;
  /** Every workbook's events (the values keeper); returns the function that unsubscribes. */
  subscribeAll(listener: WorkbookListener): () => void;
  listenerCount(workbookId: string): number;
}

export function createEventHub(onListenerError: (err: unknown) => void = (err) => console.error('workbook event listener failed', err)): EventHub {
  const listeners = new Map<string, Set<WorkbookListener>>();
  const everywhere = new Set<WorkbookListener>();
  return {
    subscribeAll(listener) {
      everywhere.add(listener);
      return () => everywhere.delete(listener);
    },
    subscribe(workbookId, listener) {
      let set = listeners.get(workbookId);
      if (!set) listeners.set(workbookId, (set = new Set()));
      set.add(listener);
      return () => {
        set.delete(listener);
        if (set.size === 0 && listeners.get(workbookId) === set) listeners.delete(workbookId);
      };
    },
    publish(workbookId, event) {
      // Copy first: a listener may unsubscribe while we iterate. A failing listener (a closed
      // connection) must not stop the others or the request that published.
      for (const listener of [...(listeners.get(workbookId) ?? []), ...everywhere]) {
        try {
          listener(event);
        } catch (err) {
          onListenerError(err);
        }
      }
    },
    listenerCount(workbookId) {
      return listeners.get(workbookId)?.size ?? 0;
    },
  };
}
