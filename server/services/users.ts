// Accounts in the database: creation with the first-admin rule, lookup, and admin changes that must
// never leave the site without an active admin.
import { and, asc, count, eq } from 'drizzle-orm';
import { generateIdFromEntropySize } from 'lucia';
import type { AdminUser, AdminUserPatch } from '../../shared/admin.js';
import type { PublicUser, SiteRole } from '../../shared/auth.js';
import type { Db } from '../db/index.js';
import { auditLog, users } from '../db/schema.js';
import { badRequest, conflict, notFound } from '../errors.js';

export type UserRow = typeof users.$inferSelect;

export const toPublicUser = (u: Pick<UserRow, 'id' | 'email' | 'name' | 'siteRole'>): PublicUser => ({
  id: u.id,
  email: u.email,
  name: u.name,
  siteRole: u.siteRole,
});

export const toAdminUser = (u: UserRow): AdminUser => ({
  ...toPublicUser(u),
  disabled: u.disabled,
  createdAt: new Date(u.createdAt).toISOString(),
});

export function findUserByEmail(db: Db, email: string): UserRow | undefined {
  return db.select().from(users).where(eq(users.email, email)).get();
}

export function findUserById(db: Db, id: string): UserRow | undefined {
  return db.select().from(users).where(eq(users.id, id)).get();
}

/**
 * Creates an account. The first account on an empty database is admin, and so is the one whose email
 * the operator named in ORBITAB_ADMIN_EMAIL. Counting and inserting share one transaction, so two
 * simultaneous first sign-ups cannot both become admin by the empty-database rule.
 */
export function createUser(db: Db, input: { email: string; name: string; passwordHash: string }, adminEmail?: string): UserRow {
  return db.transaction((tx) => {
    if (tx.select({ id: users.id }).from(users).where(eq(users.email, input.email)).get()) {
      throw conflict(`an account with the email ${input.email} already exists; sign in instead`);
    }
    const existing = tx.select({ n: count() }).from(users).get()?.n ?? 0;
    const siteRole: SiteRole = existing === 0 || input.email === adminEmail ? 'admin' : 'member';
    return tx
      .insert(users)
      .values({ id: generateIdFromEntropySize(10), email: input.email, name: input.name, passwordHash: input.passwordHash, siteRole })
      .returning()
      .get();
  });
}

/**
 * Makes the operator-named account admin when it signs in, so setting ORBITAB_ADMIN_EMAIL after the
 * account exists (say, to regain access) takes effect. The operator's setting wins over a demotion.
 */
export function promoteOperatorAdmin(db: Db, user: UserRow, adminEmail?: string): UserRow {
  if (!adminEmail || user.email !== adminEmail || user.siteRole === 'admin') return user;
  return db.transaction((tx) => {
    const promoted = tx.update(users).set({ siteRole: 'admin' }).where(eq(users.id, user.id)).returning().get();
    tx.insert(auditLog).values({ actorId: user.id, action: 'site.user_promoted_by_config', details: JSON.stringify({ userId: user.id }) }).run();
    return promoted;
  });
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
