// Cursor moves come in bursts (arrow keys held down, a drag across cells); the server and everyone
// else need only where the cursor settles. A leading-and-trailing throttle sends the first move at
// once, then at most one per interval, always ending with the latest — and never the same cell twice.

export interface ThrottleClock {
  now(): number;
  setTimeout(fn: () => void, ms: number): unknown;
  clearTimeout(handle: unknown): void;
}

const realClock: ThrottleClock = {
  now: () => Date.now(),
  setTimeout: (fn, ms) => setTimeout(fn, ms),
  clearTimeout: (h) => clearTimeout(h as ReturnType<typeof setTimeout>),
};

/** Presence is a hint, not data: four updates a second keeps chips current without flooding (common practice). */
export const presenceIntervalMs = 250;

export class LatestThrottle<T> {
  private lastSentAt = -Infinity;
  private lastSent: T | undefined;
  private waiting: { value: T } | null = null;
  private timer: unknown = null;

  constructor(
    private readonly send: (value: T) => void,
    private readonly intervalMs = presenceIntervalMs,
    private readonly same: (a: T, b: T) => boolean = Object.is,
    private readonly clock: ThrottleClock = realClock,
  ) {}

  push(value: T) {
    const due = this.lastSentAt + this.intervalMs - this.clock.now();
    if (due <= 0 && this.timer === null) {
      this.emit(value);
      return;
    }
    this.waiting = { value };
    this.timer ??= this.clock.setTimeout(() => {
      this.timer = null;
      const next = this.waiting;
      this.waiting = null;
      if (next) this.emit(next.value);
    }, Math.max(0, due));
  }

  /** Forgets what was sent, so the next push goes out even if it names the same cell (after a reconnect). */
  reset() {
    this.lastSent = undefined;
    this.lastSentAt = -Infinity;
  }

  dispose() {
    if (this.timer !== null) this.clock.clearTimeout(this.timer);
    this.timer = null;
    this.waiting = null;
  }

  private emit(value: T) {
    if (this.lastSent !== undefined && this.same(this.lastSent, value)) return;
    this.lastSent = value;
    this.lastSentAt = this.clock.now();
    this.send(value);
  }
}
