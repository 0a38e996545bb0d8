// Single-use links for an account, sent by e-mail: address verification and password reset. As
// with invitations, only the SHA-256 of the random token is stored, so a copy of the database
// cannot use one; a newer link of the same kind replaces the older.
import { createHash, randomBytes, randomUUID } from 'node:crypto';
import { and, eq, gt, isNull } from 'drizzle-orm';
import type { Db } from '../db/index.js';
import { accountTokens } from '../db/schema.js';

export type TokenPurpose = 'verify' | 'reset';

/** Verification links may sit in an inbox over a weekend; reset links are short-lived (OWASP Forgot Password Cheat Sheet, common practice). */
export const tokenLifetimeMs: Record<TokenPurpose, number> = {
  verify: 72 * 60 * 60 * 1000,
  reset: 30 * 60 * 1000,
};

export const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');

/** Stores a new token for the account (ending any unused one of the same kind) and returns it. */
export function issueToken(db: Db, user: { id: string; email: string }, purpose: TokenPurpose): { token: string; expiresAt: number } {
  const token = randomBytes(32).toString('base64url');
  const now = Date.now();
  const expiresAt = now + tokenLifetimeMs[purpose];
  db.transaction((tx) => {
    tx.update(accountTokens)
      .set({ usedAt: now })
      .where(and(eq(accountTokens.userId, user.id), eq(accountTokens.purpose, purpose), isNull(accountTokens.usedAt)))
      .run();
    tx.insert(accountTokens).values({ id: randomUUID(), userId: user.id, purpose, email: user.email, tokenHash: hashToken(token), expiresAt }).run();
  });
  return { token, expiresAt };
}

export type TokenRow = typeof accountTokens.$inferSelect;

/** The unused, unexpired token row, without using it up. */
export function findLiveToken(db: Pick<Db, 'select'>, token: string, purpose: TokenPurpose): TokenRow | undefined {
  return db
    .select()
    .from(accountTokens)
    .where(and(eq(accountTokens.tokenHash, hashToken(token)), eq(accountTokens.purpose, purpose), isNull(accountTokens.usedAt), gt(accountTokens.expiresAt, Date.now())))
    .get();
}

/**
 * Uses a token up: the update matches only while it is still unused, so two requests with the same
 * link cannot both succeed. Returns the row, or undefined when it is unknown, used or expired.
 */
export function useToken(db: Db, token: string, purpose: TokenPurpose): TokenRow | undefined {
  return db
    .update(accountTokens)
    .set({ usedAt: Date.now() })
    .where(and(eq(accountTokens.tokenHash, hashToken(token)), eq(accountTokens.purpose, purpose), isNull(accountTokens.usedAt), gt(accountTokens.expiresAt, Date.now())))
    .returning()
    .get();
}

const when = (ms: number) => new Date(ms).toISOString().replace('T', ' ').slice(0, 16);

export function verificationMail(o: { name: string; email: string; link: string; expiresAt: number }) {
  return {
    subject: 'Confirm your e-mail address for Orbitab',
    text: [
      `Hello ${o.name},`,
      '',
      `Someone (we hope you) made an Orbitab account with ${o.email}. Open this link to confirm the address is yours:`,
      o.link,
      '',
      `Until you do, you can work in your own workbooks but nobody can share one with you. The link works once and expires on ${when(o.expiresAt)} UTC.`,
      'If you did not sign up, you can ignore this message.',
    ].join('\n'),
  };
}

export function resetMail(o: { name: string; link: string; expiresAt: number }) {
  return {
    subject: 'Choose a new Orbitab password',
    text: [
      `Hello ${o.name},`,
      '',
      'Someone asked to choose a new password for your Orbitab account. To do so, open this link:',
      o.link,
      '',
      `The link works once and expires on ${when(o.expiresAt)} UTC. Choosing a new password signs out every session of the account.`,
      'If you did not ask, you can ignore this message; your password stays as it is.',
    ].join('\n'),
  };
}
