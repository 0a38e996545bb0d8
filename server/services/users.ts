// Accounts in the database: creation with the first-admin rule, lookup, and admin changes that must
// never leave the site without an active admin.
import { and, asc, count, eq, sql, type AnyColumn } from 'drizzle-orm';
import { generateIdFromEntropySize } from 'lucia';
import type { AdminUser, AdminUserPatch } from '../../shared/admin.js';
import type { PublicUser, SiteRole } from '../../shared/auth.js';
import type { Db } from '../db/index.js';
import { auditLog, users } from '../db/schema.js';
import { badRequest, conflict, notFound } from '../errors.js';

export type UserRow = typeof users.$inferSelect;

/** From a database row (emailVerifiedAt) or lucia's session user (emailVerified). */
export const toPublicUser = (u: Pick<UserRow, 'id' | 'email' | 'name' | 'siteRole'> & ({ emailVerifiedAt: number | null } | { emailVerified: boolean })): PublicUser => ({
  id: u.id,
  email: u.email,
  name: u.name,
  siteRole: u.siteRole,
  emailVerified: 'emailVerified' in u ? u.emailVerified : u.emailVerifiedAt !== null,
});

export const toAdminUser = (u: UserRow): AdminUser => ({
  ...toPublicUser(u),
  disabled: u.disabled,
  createdAt: new Date(u.createdAt).toISOString(),
});

/** Addresses compare without regard to case (stored ones are lower case; older rows may not be). */
export const sameEmail = (column: AnyColumn, email: string) => sql`lower(${column}) = ${email.trim().toLowerCase()}`;

export function findUserByEmail(db: Pick<Db, 'select'>, email: string): UserRow | undefined {
  return db.select().from(users).where(sameEmail(users.email, email)).get();
}

export function findUserById(db: Db, id: string): UserRow | undefined {
  return db.select().from(users).where(eq(users.id, id)).get();
}

/**
 * Creates an account. The first account on an empty database is admin (someone has to be, and the
 * person installing the server is the one signing up first). The operator-named ORBITAB_ADMIN_EMAIL
 * becomes admin only once its address is proved (here when the sign-up came with an invitation link
 * to that address, else at verification). Counting and inserting share one transaction, so two
 * simultaneous first sign-ups cannot both become admin by the empty-database rule.
 */
export function createUser(db: Db, input: { email: string; name: string; passwordHash: string; verified?: boolean }, adminEmail?: string): UserRow {
  const email = input.email.trim().toLowerCase();
  const created = db.transaction((tx) => {
    if (findUserByEmail(tx, email)) {
      throw conflict(`an account with the email ${email} already exists; sign in instead, or reset its password`);
    }
    const existing = tx.select({ n: count() }).from(users).get()?.n ?? 0;
    const siteRole: SiteRole = existing === 0 ? 'admin' : 'member';
    const now = Date.now();
    return tx
      .insert(users)
      .values({ id: generateIdFromEntropySize(10), email, name: input.name, passwordHash: input.passwordHash, siteRole, emailVerifiedAt: input.verified ? now : null })
      .returning()
      .get();
  });
  return promoteOperatorAdmin(db, created, adminEmail);
}

/**
 * Makes the operator-named account admin, once: only when its address is verified (so signing up
 * first with someone else's address gains nothing) and only the first time (configPromotedAt), so an
 * admin who later demotes it is not overruled at its next sign-in.
 */
export function promoteOperatorAdmin(db: Db, user: UserRow, adminEmail?: string): UserRow {
  if (!adminEmail || user.email.toLowerCase() !== adminEmail.toLowerCase()) return user;
  if (user.emailVerifiedAt === null || user.configPromotedAt !== null) return user;
  return db.transaction((tx) => {
    const promoted = tx.update(users).set({ siteRole: 'admin', configPromotedAt: Date.now() }).where(eq(users.id, user.id)).returning().get();
    tx.insert(auditLog).values({ actorId: user.id, action: 'site.user_promoted_by_config', details: JSON.stringify({ userId: user.id, wasAdmin: user.siteRole === 'admin' }) }).run();
    return promoted;
  });
}

/** Records that the account's owner proved the address, then applies ORBITAB_ADMIN_EMAIL if it names them. */
export function markEmailVerified(db: Db, userId: string, adminEmail?: string): UserRow {
  const user = db.update(users).set({ emailVerifiedAt: sql`coalesce(${users.emailVerifiedAt}, ${Date.now()})` }).where(eq(users.id, userId)).returning().get();
  if (!user) throw notFound('user');
  return promoteOperatorAdmin(db, user, adminEmail);
}

export function listUsers(db: Db): AdminUser[] {
  return db.select().from(users).orderBy(asc(users.createdAt), asc(users.email)).all().map(toAdminUser);
}

/**
 * Applies an admin's change to an account. The change and the check that at least one enabled admin
 * remains run in one transaction; a change that would leave none is rolled back with a 400.
 */
export function updateUser(db: Db, actorId: string, userId: string, patch: AdminUserPatch): UserRow {
  return db.transaction((tx) => {
    const before = tx.select().from(users).where(eq(users.id, userId)).get();
    if (!before) throw notFound('user');
    if (patch.siteRole === 'admin' && before.siteRole !== 'admin' && before.emailVerifiedAt === null) {
      throw conflict(`${before.email} has not verified this address yet; an account becomes admin only once its owner has proved the mailbox`);
    }
    const after = tx.update(users).set(patch).where(eq(users.id, userId)).returning().get();
    const activeAdmins = tx
      .select({ n: count() })
      .from(users)
      .where(and(eq(users.siteRole, 'admin'), eq(users.disabled, false)))
      .get()?.n ?? 0;
    if (activeAdmins === 0) {
      const what = patch.disabled ? 'disable' : 'demote';
      const whom = actorId === userId ? 'yourself' : 'this account';
      throw badRequest(`cannot ${what} ${whom}: it is the last enabled admin; make another account admin first`);
    }
    const changes = Object.fromEntries(
      (Object.keys(patch) as (keyof AdminUserPatch)[]).filter((k) => before[k] !== after[k]).map((k) => [k, { from: before[k], to: after[k] }]),
    );
    tx.insert(auditLog).values({ actorId, action: 'site.user_updated', details: JSON.stringify({ userId, changes }) }).run();
    return after;
  });
}
