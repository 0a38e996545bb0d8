// First-start demo data: on a database with no accounts yet (and ORBITAB_SEED=1, the default), an
// invented team of three and three workbooks of our own scenario, so a new team sees Orbitab doing
// real work in the first minute. Everything goes through the same services as the API (accounts,
// workbooks, tabs, patches, members, locks), in one transaction: all of it or none of it.
import type { User } from 'lucia';
import { patchSchema } from '../../shared/workbooks.js';
import { protectedRangeSchema, sheetLockSchema } from '../../shared/team.js';
import { hashPassword, verifyPassword } from '../auth/password.js';
import type { AppContext } from '../context.js';
import { users } from '../db/schema.js';
import { requireWorkbook } from '../services/access.js';
import { lockSheet, protectRange } from '../services/locks.js';
import { addMember } from '../services/members.js';
import { applyPatch } from '../services/patches.js';
import { addSheet, updateSheet } from '../services/sheetStore.js';
import { createUser, findUserByEmail, type UserRow } from '../services/users.js';
import { createWorkbook, loadWorkbook } from '../services/workbookStore.js';
import { demoTeam } from './demoTeam.js';
import { dyeCandidatesWorkbook } from './dyeCandidates.js';
import { flameRadicalsWorkbook } from './flameRadicals.js';
import { gasSensorWorkbook } from './gasSensor.js';
import type { DemoPerson, DemoWorkbook } from './types.js';

export const demoWorkbooks: readonly DemoWorkbook[] = [gasSensorWorkbook, flameRadicalsWorkbook, dyeCandidatesWorkbook];
export { demoTeam };

export type SeedResult = { seeded: true; people: readonly DemoPerson[]; workbookIds: string[] } | { seeded: false; reason: string };

const hasAccounts = (ctx: AppContext) => ctx.db.select({ id: users.id }).from(users).limit(1).get() !== undefined;

function writeWorkbook(ctx: AppContext, owner: UserRow, others: { user: UserRow; role: 'editor' | 'viewer' }[], book: DemoWorkbook): string {
  const actor: Pick<User, 'id' | 'siteRole'> = { id: owner.id, siteRole: owner.siteRole };
  const workbookId = createWorkbook(ctx, actor, book.title);
  const firstSheetId = loadWorkbook(ctx, requireWorkbook(ctx, actor, workbookId, 'view')).sheets[0].id;

  const sheetIds = book.sheets.map((sheet, i) => {
    const sheetId = i === 0 ? firstSheetId : addSheet(ctx, workbookId, owner.id, { name: sheet.name }).sheet.id;
    updateSheet(ctx, workbookId, sheetId, owner.id, { ...(i === 0 ? { name: sheet.name } : {}), settings: sheet.settings ?? {} });
    return sheetId;
  });

  // Cells before locks: the owner writes the settled values first, then closes the sheet.
  book.sheets.forEach((sheet, i) => {
    const changes = sheet.rows.flatMap((cells, row) => cells.map((input, col) => ({ sheetId: sheetIds[i], row, col, input }))).filter((c) => c.input !== '');
    const baseRevision = loadWorkbook(ctx, requireWorkbook(ctx, actor, workbookId, 'view')).revision;
    applyPatch(ctx, workbookId, owner.id, patchSchema.parse({ baseRevision, changes }));
  });

  for (const { user, role } of others) addMember(ctx, workbookId, owner.id, { id: user.id, email: user.email }, role);

  const access = requireWorkbook(ctx, actor, workbookId, 'view');
  book.sheets.forEach((sheet, i) => {
    for (const range of sheet.protectedRanges ?? []) protectRange(ctx, access, owner.id, sheetIds[i], protectedRangeSchema.parse({ range, editors: [] }));
    if (sheet.lockReason) lockSheet(ctx, access, owner.id, sheetIds[i], sheetLockSchema.parse({ reason: sheet.lockReason, editors: [] }));
  });
  return workbookId;
}

/** Seeds the demo team and workbooks when the database has no accounts; otherwise does nothing. */
export async function seedOnFirstStart(ctx: AppContext): Promise<SeedResult> {
  if (hasAccounts(ctx)) return { seeded: false, reason: 'the database already has accounts' };
  // argon2 is asynchronous; hash first so the writes below can share one synchronous transaction.
  const hashes: string[] = [];
  for (const person of demoTeam) hashes.push(await hashPassword(person.password));

  const result = ctx.db.transaction(
    (): SeedResult => {
      // Checked again inside the transaction: someone may have signed up while we hashed.
      if (hasAccounts(ctx)) return { seeded: false, reason: 'the database already has accounts' };
      const people = demoTeam.map((p, i) => ({ person: p, user: createUser(ctx.db, { email: p.email, name: p.name, passwordHash: hashes[i], verified: true }, ctx.config.adminEmail) }));
      const owner = people.find((p) => p.person.role === 'owner')!.user;
      const others = people.filter((p) => p.person.role !== 'owner').map((p) => ({ user: p.user, role: p.person.role as 'editor' | 'viewer' }));
      const workbookIds = demoWorkbooks.map((book) => writeWorkbook(ctx, owner, others, book));
      return { seeded: true, people: demoTeam, workbookIds };
    },
    { behavior: 'immediate' },
  );
  if (result.seeded) ctx.logger.info({ accounts: demoTeam.length, workbooks: result.workbookIds.length }, 'demo data seeded');
  return result;
}

/** What `npm start` prints once, after seeding: who can sign in, and that these passwords are public. */
export function seedBanner(result: SeedResult): string | null {
  if (!result.seeded) return null;
  const width = Math.max(...result.people.map((p) => p.email.length));
  return [
    `Orbitab created a demo team and ${result.workbookIds.length} demo workbooks (set ORBITAB_SEED=0 to start empty):`,
    ...result.people.map((p) => `  ${p.role.padEnd(6)}  ${p.email.padEnd(width)}  password: ${p.password}`),
    'These demo passwords are public (they are in the README); for real work start on a new database with ORBITAB_SEED=0.',
  ].join('\n');
}

/**
 * The demo accounts that still sign in with the password printed in the README. Listening beyond
 * this machine while any exist lets anyone on the network in as their owner.
 */
export async function demoAccountsWithPublicPasswords(ctx: AppContext): Promise<string[]> {
  const open: string[] = [];
  for (const person of demoTeam) {
    const user = findUserByEmail(ctx.db, person.email);
    if (user && !user.disabled && (await verifyPassword(user.passwordHash, person.password))) open.push(person.email);
  }
  return open;
}
