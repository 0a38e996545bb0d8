// Sign-in attempt limits (and a sign-up limit per address), kept in this process's memory.
//
// Why by hand: the rule we need is "count *failed* passwords per account (keyed by the normalised
// email from the validated body) and *all* attempts per client address, check both before spending
// an argon2 verification, forget an account's failures once it signs in, and answer both with one
// JSON 429". A generic per-route request limiter would need two instances, body-derived keys and a
// custom success test to approximate it; this file is the whole rule in about sixty lines.
//
// In memory is correct for one server process (the supported deployment: one SQLite file on one
// machine). Several servers behind a load balancer would each count separately; move the counters
// into the database or a shared store then. One instance lives on each app's context, so tests that
// build their own app never share counters.

export interface AttemptLimit {
  /** Attempts allowed inside one window; the next one is refused until the window ends. */
  max: number;
  windowMs: number;
}

/**
 * 5 failed passwords per account per 15 minutes slows a guesser on one account to 480 guesses a day
 * while a person who mistypes a few times is not locked out for long; 20 attempts per address per
 * 15 minutes covers a lab behind one NAT signing in after a restart yet stops spraying many accounts
 * from one address. Both in line with OWASP Authentication Cheat Sheet advice on throttling (common
 * practice; the numbers are our choice).
 */
export const signInLimitDefaults = {
  perAccount: { max: 5, windowMs: 15 * 60_000 },
  perAddress: { max: 20, windowMs: 15 * 60_000 },
} satisfies Record<string, AttemptLimit>;

/**
 * Sign-ups per client address: each costs an argon2 hash (tens of milliseconds of CPU) and makes an
 * account, so a script must not be able to repeat it freely. 30 an hour lets a lab behind one NAT
 * onboard a group in one sitting (common practice; the number is our choice).
 */
export const signUpLimitDefault: AttemptLimit = { max: 30, windowMs: 60 * 60_000 };

export type LimitCheck = { allowed: true } | { allowed: false; retryAfterMs: number };

interface Window {
  count: number;
  endsAt: number;
}

/** A fixed window per key that opens at the key's first counted attempt. */
export class AttemptLimiter {
  private readonly windows = new Map<string, Window>();

  constructor(
    readonly limit: AttemptLimit,
    private readonly now: () => number = Date.now,
  ) {}

  check(key: string): LimitCheck {
    const w = this.current(key);
    if (!w || w.count < this.limit.max) return { allowed: true };
    return { allowed: false, retryAfterMs: w.endsAt - this.now() };
  }

  record(key: string): void {
    const w = this.current(key);
    if (w) w.count += 1;
    else {
      if (this.windows.size >= 10_000) this.sweep();
      this.windows.set(key, { count: 1, endsAt: this.now() + this.limit.windowMs });
    }
  }

  reset(key: string): void {
    this.windows.delete(key);
  }

  private current(key: string): Window | undefined {
    const w = this.windows.get(key);
    if (w && w.endsAt <= this.now()) {
      this.windows.delete(key);
      return undefined;
    }
    return w;
  }

  /** Drops ended windows, so the map holds only keys seen within the last window. */
  private sweep() {
    const t = this.now();
    for (const [key, w] of this.windows) if (w.endsAt <= t) this.windows.delete(key);
  }
}

/** The sign-in limits, and the sign-up limit beside them (the same kind of counter). */
export interface SignInLimits {
  perAccount: AttemptLimiter;
  perAddress: AttemptLimiter;
  signUpPerAddress: AttemptLimiter;
}

export function createSignInLimits(
  limits: { perAccount?: AttemptLimit; perAddress?: AttemptLimit; signUpPerAddress?: AttemptLimit } = {},
  now: () => number = Date.now,
): SignInLimits {
  return {
    perAccount: new AttemptLimiter(limits.perAccount ?? signInLimitDefaults.perAccount, now),
    perAddress: new AttemptLimiter(limits.perAddress ?? signInLimitDefaults.perAddress, now),
    signUpPerAddress: new AttemptLimiter(limits.signUpPerAddress ?? signUpLimitDefault, now),
  };
}
