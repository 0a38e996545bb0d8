// Puts remote revisions in order before they touch the engine: each applied exactly once, oldest
// first, none skipped. The event stream can start after the page loaded the workbook (the revisions
// in between are fetched), replay on reconnect (duplicates are dropped) or deliver a later revision
// while an earlier one is still being fetched (it waits).
import type { RemoteRevision } from './remoteRevision.js';

export interface RevisionFeedOptions {
  /** The revision the page's engine already shows. */
  start: number;
  apply: (rev: RemoteRevision) => void;
  fetchRevision: (n: number) => Promise<RemoteRevision>;
  /** Too far behind to catch up revision by revision: the page should load the workbook again. */
  onTooFarBehind: (revision: number) => void;
  onError?: (error: unknown) => void;
  /** Above this many missing revisions, reloading is cheaper than fetching each (common practice: bounded catch-up). */
  maxFetched?: number;
}

export class RevisionFeed {
  private lastApplied: number;
  private buffer = new Map<number, RemoteRevision>();
  private fetching = false;
  private target = 0;
  private stopped = false;

  constructor(private readonly opts: RevisionFeedOptions) {
    this.lastApplied = opts.start;
  }

  get last() {
    return this.lastApplied;
  }

  /** A revision event from the stream. */
  receive(rev: RemoteRevision) {
    if (this.stopped || rev.revision <= this.lastApplied) return;
    this.buffer.set(rev.revision, rev);
    this.target = Math.max(this.target, rev.revision);
    this.drain();
  }

  /** The stream's `ready` event names the workbook's revision now: fetch whatever is missing up to it. */
  catchUp(revision: number) {
    if (this.stopped) return;
    this.target = Math.max(this.target, revision);
    this.drain();
  }

  stop() {
    this.stopped = true;
    this.buffer.clear();
  }

  private drain() {
    while (this.buffer.has(this.lastApplied + 1)) {
      const rev = this.buffer.get(this.lastApplied + 1)!;
      this.buffer.delete(rev.revision);
      this.lastApplied = rev.revision;
      this.opts.apply(rev);
      if (this.stopped) return;
    }
    if (this.lastApplied < this.target && !this.fetching) void this.fillGap();
  }

  private async fillGap() {
    const missing: number[] = [];
    for (let n = this.lastApplied + 1; n <= this.target; n++) if (!this.buffer.has(n)) missing.push(n);
    if (missing.length > (this.opts.maxFetched ?? 50)) {
      this.stop();
      this.opts.onTooFarBehind(this.target);
      return;
    }
    this.fetching = true;
    try {
      // In order, so each one can be applied as soon as it arrives.
      for (const n of missing) {
        if (this.stopped) return;
        if (n <= this.lastApplied || this.buffer.has(n)) continue;
        this.buffer.set(n, await this.opts.fetchRevision(n));
        this.drain();
      }
    } catch (error) {
      // Tried again on the next event or reconnect, not in a tight loop against a failing server.
      this.fetching = false;
      this.opts.onError?.(error);
      return;
    }
    this.fetching = false;
    if (!this.stopped && this.lastApplied < this.target) this.drain();
  }
}
