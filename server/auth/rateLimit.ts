// Attempt limits for the account routes, counted in this process's memory by rate-limiter-flexible.
//
// Every limit is taken *before* the expensive or revealing work (an argon2 hash, an e-mail): the
// counter moves synchronously when the request asks, so fifty requests arriving together cannot all
// pass a check that is only recorded after their password was hashed. Sign-in gives the point back
// when the password was right, so only failures count and a lab signing in behind one address after
// a restart is never locked out by its own successes.
//
// In memory is correct for one server process (the supported deployment: one SQLite file on one
// machine). Several servers behind a load balancer would each count separately; the package's other
// stores (a database or Redis) would share the counts then. One set lives on each app's context, so
// tests that build their own app never share counters.
import { RateLimiterMemory, RateLimiterRes } from 'rate-limiter-flexible';
import type { RateLimitDetails } from '../../shared/auth.js';
import { HttpError } from '../errors.js';

export interface AttemptLimit {
  /** Attempts allowed inside one window; the next one is refused until the window ends. */
  max: number;
  windowMs: number;
}

const minutes = (n: number) => n * 60_000;

/**
 * 5 failed passwords per account per 15 minutes slows a guesser on one account to 480 guesses a day
 * while a person who mistypes a few times is not locked out for long; 20 failures per address per
 * 15 minutes stops spraying many accounts from one address. Sign-ups: 30 an hour per address lets a
 * lab behind one NAT onboard a group in one sitting. Resets and verification mails are limited per
 * address and per account so the app cannot be used to flood someone's mailbox; invitations per
 * inviter for the same reason. All in line with the OWASP Authentication and Forgot Password Cheat
 * Sheets' advice on throttling (common practice; the numbers are our choice).
 */
export const limitDefaults = {
  signInPerAccount: { max: 5, windowMs: minutes(15) },
  signInPerAddress: { max: 20, windowMs: minutes(15) },
  signUpPerAddress: { max: 30, windowMs: minutes(60) },
  resetPerAccount: { max: 3, windowMs: minutes(60) },
  resetPerAddress: { max: 20, windowMs: minutes(60) },
  verifyMailPerUser: { max: 5, windowMs: minutes(60) },
  passwordChangePerUser: { max: 5, windowMs: minutes(15) },
  invitationsPerInviter: { max: 30, windowMs: minutes(60) },
} satisfies Record<string, AttemptLimit>;

export type LimitName = keyof typeof limitDefaults;

/** One counter per key over a fixed window that opens at the key's first attempt. */
export class AttemptLimiter {
  private readonly counter: RateLimiterMemory;

  constructor(
    readonly limit: AttemptLimit,
    readonly name: string,
  ) {
    this.counter = new RateLimiterMemory({ keyPrefix: name, points: limit.max, duration: Math.ceil(limit.windowMs / 1000) });
  }

  /**
   * Takes one attempt for `key`, or throws the 429 that says when to come back. The memory store
   * updates the count before its promise settles, so concurrent callers are counted one by one.
   */
  async take(key: string, scope: RateLimitDetails['scope'], what: string): Promise<void> {
    try {
      await this.counter.consume(key, 1);
    } catch (e) {
      if (e instanceof RateLimiterRes) throw rateLimited(e.msBeforeNext, scope, what);
      throw e;
    }
  }

  /** Gives back an attempt that turned out not to count (a right password). */
  async giveBack(key: string): Promise<void> {
    await this.counter.reward(key, 1);
  }

  /** Forgets the key's attempts (an account's failures once its owner signs in or resets). */
  async forget(key: string): Promise<void> {
    await this.counter.delete(key);
  }
}

export function rateLimited(retryAfterMs: number, scope: RateLimitDetails['scope'], what: string): HttpError {
  const retryAfterSeconds = Math.max(1, Math.ceil(retryAfterMs / 1000));
  const mins = Math.ceil(retryAfterSeconds / 60);
  const who = scope === 'account' ? 'this account' : scope === 'address' ? 'your address' : 'you';
  return new HttpError(
    429,
    'rate_limited',
    `too many ${what} for ${who}; try again in ${mins} minute${mins === 1 ? '' : 's'}`,
    { retryAfterSeconds, retryAt: new Date(Date.now() + retryAfterSeconds * 1000).toISOString(), scope } satisfies RateLimitDetails,
    { 'Retry-After': String(retryAfterSeconds) },
  );
}

export type AccountLimits = Record<LimitName, AttemptLimiter>;

export function createAccountLimits(overrides: Partial<Record<LimitName, AttemptLimit>> = {}): AccountLimits {
  return Object.fromEntries(
    (Object.keys(limitDefaults) as LimitName[]).map((name) => [name, new AttemptLimiter(overrides[name] ?? limitDefaults[name], name)]),
  ) as AccountLimits;
}
