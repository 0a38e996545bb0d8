// The whole data model in one file; `npm run db:generate` writes the SQL migrations into drizzle/.
import { sql } from 'drizzle-orm';
import { blob, index, integer, primaryKey, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { siteRoles } from '../../shared/auth.js';
import { sheetRoleNames, workbookRoles } from '../../shared/permissions.js';
import { grantableRoles } from '../../shared/team.js';
import type { RevisionPatch, SheetSettings, StoredValueExtras } from '../../shared/workbooks.js';

const now = sql`(unixepoch('subsec') * 1000)`;

export const users = sqliteTable('users', {
  id: text('id').primaryKey(),
  email: text('email').notNull().unique(),
  name: text('name').notNull(),
  passwordHash: text('password_hash').notNull(),
  siteRole: text('site_role', { enum: siteRoles }).notNull().default('member'),
  disabled: integer('disabled', { mode: 'boolean' }).notNull().default(false),
  /** When the owner of the address proved it (a mailed link); null until then. */
  emailVerifiedAt: integer('email_verified_at'),
  /** When ORBITAB_ADMIN_EMAIL made this account admin; it happens once, so a later demotion sticks. */
  configPromotedAt: integer('config_promoted_at'),
  createdAt: integer('created_at').notNull().default(now),
});

/**
 * Single-use links sent by e-mail for an account: address verification and password reset. Only the
 * SHA-256 of the token is kept, as for invitations.
 */
export const accountTokens = sqliteTable(
  'account_tokens',
  {
    id: text('id').primaryKey(),
    userId: text('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
    purpose: text('purpose', { enum: ['verify', 'reset'] }).notNull(),
    /** The address the link was sent to; a verification proves only this one. */
    email: text('email').notNull(),
    tokenHash: text('token_hash').notNull().unique(),
    expiresAt: integer('expires_at').notNull(),
    usedAt: integer('used_at'),
    createdAt: integer('created_at').notNull().default(now),
  },
  (t) => [index('account_tokens_user_idx').on(t.userId)],
);

// lucia's session table: expires_at in seconds since the epoch, as @lucia-auth/adapter-drizzle expects.
export const sessions = sqliteTable('sessions', {
  id: text('id').primaryKey(),
  userId: text('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  expiresAt: integer('expires_at').notNull(),
});

export const workbooks = sqliteTable('workbooks', {
  id: text('id').primaryKey(),
  title: text('title').notNull(),
  ownerId: text('owner_id').notNull().references(() => users.id),
  revision: integer('revision').notNull().default(0),
  createdAt: integer('created_at').notNull().default(now),
  updatedAt: integer('updated_at').notNull().default(now),
});

export const workbookMembers = sqliteTable(
  'workbook_members',
  {
    workbookId: text('workbook_id').notNull().references(() => workbooks.id, { onDelete: 'cascade' }),
    userId: text('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
    role: text('role', { enum: workbookRoles }).notNull(),
    createdAt: integer('created_at').notNull().default(now),
  },
  (t) => [primaryKey({ columns: [t.workbookId, t.userId] }), index('members_user_idx').on(t.userId)],
);

export const sheets = sqliteTable(
  'sheets',
  {
    id: text('id').primaryKey(),
    workbookId: text('workbook_id').notNull().references(() => workbooks.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    position: integer('position').notNull(),
    createdBy: text('created_by').references(() => users.id),
    /** Display settings (column widths, frozen rows, precision) as JSON. */
    settings: text('settings', { mode: 'json' }).$type<SheetSettings>().notNull().default({}),
  },
  (t) => [uniqueIndex('sheets_name_idx').on(t.workbookId, t.name), index('sheets_workbook_idx').on(t.workbookId)],
);

// Sparse: only non-empty cells have a row. `revision` is the workbook revision that last wrote the cell
// (also kept when a cell is cleared, as an empty input, so conflicts on cleared cells are seen).
export const cells = sqliteTable(
  'cells',
  {
    sheetId: text('sheet_id').notNull().references(() => sheets.id, { onDelete: 'cascade' }),
    row: integer('row').notNull(),
    col: integer('col').notNull(),
    input: text('input').notNull(),
    revision: integer('revision').notNull(),
  },
  (t) => [primaryKey({ columns: [t.sheetId, t.row, t.col] })],
);

export const revisions = sqliteTable(
  'revisions',
  {
    workbookId: text('workbook_id').notNull().references(() => workbooks.id, { onDelete: 'cascade' }),
    number: integer('number').notNull(),
    authorId: text('author_id').references(() => users.id),
    kind: text('kind').notNull().default('edit'),
    /** JSON: the changes of this revision, each with the input before and after. */
    patch: text('patch', { mode: 'json' }).$type<RevisionPatch>().notNull(),
    createdAt: integer('created_at').notNull().default(now),
  },
  (t) => [primaryKey({ columns: [t.workbookId, t.number] })],
);

/**
 * The computed values of one revision, kept so /values and exports read them instead of running the
 * engine again. Written after the revision's commit by the values keeper (server/values/keeper.ts);
 * a revision without a row is computed on demand as before. Only each workbook's newest row is kept.
 */
export const revisionValues = sqliteTable(
  'revision_values',
  {
    workbookId: text('workbook_id').notNull().references(() => workbooks.id, { onDelete: 'cascade' }),
    revision: integer('revision').notNull(),
    /** The GET /values answer for this revision, as gzip-compressed UTF-8 JSON. */
    valuesGzip: blob('values_gzip', { mode: 'buffer' }).notNull(),
    /** What an export needs beyond /values: date kinds, spill areas, empty texts, bare errors. */
    extras: text('extras', { mode: 'json' }).$type<StoredValueExtras>().notNull(),
    /**
     * JSON of the workbook's count of non-empty cells and each sheet's values in its first rows and
     * columns (firstRowsShown × firstColsShown), for GET …/first-rows (storedFormat.ts
     * StoredFirstRows); null in rows stored before it was kept.
     */
    firstRows: text('first_rows'),
    /** Formulas calling a function of the clock or of chance: such a revision is recomputed on every read. */
    volatileFormulas: integer('volatile_formulas').notNull().default(0),
    computedMs: integer('computed_ms').notNull().default(0),
    createdAt: integer('created_at').notNull().default(now),
  },
  (t) => [primaryKey({ columns: [t.workbookId, t.revision] })],
);

/**
 * A locked sheet: everyone is a viewer of it except the members `sheet_roles` names editor. The lock
 * itself keeps only who closed it, when and why.
 */
export const sheetLocks = sqliteTable('sheet_locks', {
  sheetId: text('sheet_id').primaryKey().references(() => sheets.id, { onDelete: 'cascade' }),
  lockedBy: text('locked_by').notNull().references(() => users.id),
  reason: text('reason').notNull(),
  createdAt: integer('created_at').notNull().default(now),
});

/** A member's role on one sheet, overriding their workbook role in either direction. */
export const sheetRoles = sqliteTable(
  'sheet_roles',
  {
    sheetId: text('sheet_id').notNull().references(() => sheets.id, { onDelete: 'cascade' }),
    userId: text('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
    role: text('role', { enum: sheetRoleNames }).notNull(),
    /** Named by the sheet's lock: lifting or replacing the lock takes it away. */
    viaLock: integer('via_lock', { mode: 'boolean' }).notNull().default(false),
    setBy: text('set_by').notNull().references(() => users.id),
    createdAt: integer('created_at').notNull().default(now),
  },
  (t) => [primaryKey({ columns: [t.sheetId, t.userId] }), index('sheet_roles_user_idx').on(t.userId)],
);

export const protectedRanges = sqliteTable(
  'protected_ranges',
  {
    id: text('id').primaryKey(),
    sheetId: text('sheet_id').notNull().references(() => sheets.id, { onDelete: 'cascade' }),
    range: text('range').notNull(),
    editors: text('editors', { mode: 'json' }).$type<string[]>().notNull().default([]),
    createdBy: text('created_by').notNull().references(() => users.id),
    createdAt: integer('created_at').notNull().default(now),
  },
  (t) => [index('protected_sheet_idx').on(t.sheetId)],
);

export const invitations = sqliteTable('invitations', {
  id: text('id').primaryKey(),
  workbookId: text('workbook_id').notNull().references(() => workbooks.id, { onDelete: 'cascade' }),
  email: text('email').notNull(),
  role: text('role', { enum: grantableRoles }).notNull(),
  tokenHash: text('token_hash').notNull().unique(),
  invitedBy: text('invited_by').notNull().references(() => users.id),
  expiresAt: integer('expires_at').notNull(),
  acceptedAt: integer('accepted_at'),
  revokedAt: integer('revoked_at'),
  createdAt: integer('created_at').notNull().default(now),
});

/** Messages received by the built-in fake SMTP server (the dev inbox). */
export const mailMessages = sqliteTable('mail_messages', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  from: text('from').notNull(),
  to: text('to').notNull(),
  subject: text('subject').notNull(),
  text: text('text').notNull(),
  receivedAt: integer('received_at').notNull().default(now),
});

export const auditLog = sqliteTable(
  'audit_log',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    workbookId: text('workbook_id'),
    actorId: text('actor_id'),
    action: text('action').notNull(),
    details: text('details', { mode: 'json' }).$type<Record<string, unknown>>().notNull().default({}),
    createdAt: integer('created_at').notNull().default(now),
  },
  (t) => [index('audit_workbook_idx').on(t.workbookId)],
);

/**
 * Extended-Hückel results, one per structure per workbook (functions/chem/ehtSummary.ts): computed once in
 * the compute pool and read by every member's browser, /values and exports. `key` is the SHA-256 of the
 * method version, charge and normalised structure text, so a new method version never reads an old result.
 * Kept per workbook, so asking for a structure says nothing about what other workbooks hold.
 */
export const structureResults = sqliteTable(
  'structure_results',
  {
    workbookId: text('workbook_id').notNull().references(() => workbooks.id, { onDelete: 'cascade' }),
    key: text('key').notNull(),
    /** The EhtResult as JSON text: sent to browsers as it is, never parsed on the server's main thread. */
    result: text('result').notNull(),
    computeMs: integer('compute_ms').notNull(),
    createdAt: integer('created_at').notNull().default(now),
  },
  (t) => [primaryKey({ columns: [t.workbookId, t.key] })],
);
