// Working as a team: members and roles, invitations by e-mail, sheet locks and protected ranges,
// live updates (Server-Sent Events) and presence, the audit log and the dev inbox. The request
// bodies the server validates (and the client's forms reuse) and the payloads the API returns.
import { z } from 'zod';
import { emailSchema } from './auth.js';
import { boundsContain, formatCellRange, parseCellRange, type CellBounds } from './cellRange.js';
import { effectiveSheetRole, sheetRoleNames, workbookRoles, type AccessRole, type EffectiveSheetRole, type SheetRole, type WorkbookAction, type WorkbookRole } from './permissions.js';
import { idSchema, maxColIndex, maxRowIndex, type RevisionKind, type SheetPayload, type WorkbookSummary } from './workbooks.js';

// ---- requests ----

/** Roles that can be given by adding or inviting; ownership moves only by transfer (PATCH role 'owner'). */
export const grantableRoles = ['editor', 'viewer'] as const;
export type GrantableRole = (typeof grantableRoles)[number];
export const grantableRoleSchema = z.enum(grantableRoles, { error: 'must be "editor" or "viewer"' });
export const memberRoleSchema = z.enum(workbookRoles, { error: 'must be "owner", "editor" or "viewer"' });

/** POST /api/workbooks/:id/members: an existing account joins at once (201), anyone else is invited (202). */
export const addMemberSchema = z.object({ email: emailSchema, role: grantableRoleSchema });
export type AddMemberInput = z.infer<typeof addMemberSchema>;

/** POST /api/workbooks/:id/invitations: always an invitation by e-mail. */
export const createInvitationSchema = addMemberSchema;
export type CreateInvitationInput = AddMemberInput;

/** PATCH /api/workbooks/:id/members/:userId. Role 'owner' transfers ownership (see MemberRoleResult). */
export const changeMemberRoleSchema = z.object({ role: memberRoleSchema });
export type ChangeMemberRoleInput = z.infer<typeof changeMemberRoleSchema>;

const editorsSchema = z.array(idSchema, { error: 'must be a list of user ids' }).max(100, 'at most 100 people').default([]);

/** PUT /api/workbooks/:id/sheets/:sheetId/lock. The locker may always edit; `editors` may too. */
export const sheetLockSchema = z.object({
  reason: z.string({ error: (i) => (i.input === undefined ? 'required' : 'must be text') }).trim().min(1, 'required: say why the sheet is locked').max(500, 'at most 500 characters'),
  editors: editorsSchema,
});
export type SheetLockInput = z.input<typeof sheetLockSchema>;

/** PUT /api/workbooks/:id/sheets/:sheetId/roles: set one member's role on the sheet, or (null) go back to their workbook role. */
export const setSheetRoleSchema = z.object({
  email: emailSchema,
  role: z.enum(sheetRoleNames, { error: 'must be "editor", "viewer" or null' }).nullable(),
});
export type SetSheetRoleInput = z.infer<typeof setSheetRoleSchema>;

/** POST /api/workbooks/:id/sheets/:sheetId/protected-ranges. Its creator may always edit it. */
export const protectedRangeSchema = z.object({
  range: z
    .string({ error: (i) => (i.input === undefined ? 'required' : 'must be text') })
    .trim()
    .max(40, 'at most 40 characters')
    .refine((r) => parseCellRange(r) !== null, { error: (i) => `"${String(i.input)}" is not a range in A1 notation on the grid (like B2, A1:C3, A:C or 2:5)` })
    .transform((r) => formatCellRange(parseCellRange(r)!)),
  editors: editorsSchema,
});
export type ProtectedRangeInput = z.input<typeof protectedRangeSchema>;

/** POST /api/workbooks/:id/presence: where the caller's cursor is. */
export const presenceSchema = z.object({
  sheetId: idSchema,
  row: z.int('must be a whole number').min(0, 'must be 0 or more').max(maxRowIndex, `must be at most ${maxRowIndex}`),
  col: z.int('must be a whole number').min(0, 'must be 0 or more').max(maxColIndex, `must be at most ${maxColIndex}`),
});
export type PresenceInput = z.infer<typeof presenceSchema>;

export const auditQuerySchema = z.object({
  /** Only entries with a smaller id (paging backwards). */
  before: z.coerce.number({ error: 'must be a whole number' }).int('must be a whole number').min(1, 'must be 1 or more').optional(),
  limit: z.coerce.number({ error: 'must be a whole number' }).int('must be a whole number').min(1, 'must be 1 or more').max(500, 'at most 500').default(100),
});

// ---- payloads ----

export interface UserRef {
  id: string;
  name: string;
}

export interface Member {
  user: UserRef & { email: string };
  role: WorkbookRole;
  /** When they joined (ms since the epoch). */
  since: number;
}
/** GET /api/workbooks/:id/members (any member or a site admin). */
export interface MembersResponse {
  members: Member[];
}

export type InvitationStatus = 'pending' | 'accepted' | 'revoked' | 'expired';
export interface Invitation {
  id: string;
  email: string;
  role: GrantableRole;
  invitedBy: UserRef;
  createdAt: number;
  expiresAt: number;
  status: InvitationStatus;
}
/** POST …/members answers 201 `{ member }` for an existing account, 202 `{ invitation }` otherwise; POST …/invitations answers 201 `{ invitation }`. */
export type AddMemberResponse = { member: Member } | { invitation: Invitation };
/** GET /api/workbooks/:id/invitations: pending ones only (owners). */
export interface InvitationsResponse {
  invitations: Invitation[];
}
/** GET /api/invitations/:token: what the link offers, shown before accepting (no sign-in needed). */
export interface InvitationPreview {
  workbook: { id: string; title: string };
  email: string;
  role: GrantableRole;
  invitedBy: UserRef;
  expiresAt: number;
  status: InvitationStatus;
}
/** POST /api/invitations/:token/accept. */
export interface AcceptInvitationResponse {
  workbookId: string;
  role: WorkbookRole;
}
/** PATCH …/members/:userId. After a transfer `previousOwner` is the caller, now an editor. */
export interface MemberRoleResult {
  member: Member;
  previousOwner?: Member;
}

/**
 * A locked sheet: everyone is a viewer of it except those it names editor. The names are the
 * sheet's editor overrides (`SheetRoles`); `editors` repeats them for display.
 */
export interface SheetLock {
  sheetId: string;
  lockedBy: UserRef;
  reason: string;
  /** Who may still change the sheet: its editor overrides (the locker among them unless removed since). */
  editors: UserRef[];
  createdAt: number;
}

/** One member's role set on one sheet, overriding their workbook role. */
export interface SheetRoleOverride {
  user: UserRef;
  role: SheetRole;
  setBy: UserRef;
  /** Named as part of a lock: lifting or replacing the lock takes it away. */
  viaLock: boolean;
  since: number;
}
export interface SheetRoles {
  sheetId: string;
  overrides: SheetRoleOverride[];
}

/** Who is asking: their id and membership role (null for a site admin who is not a member). */
export interface SheetActor {
  id: string;
  role: WorkbookRole | null;
}

/** GET and PUT /api/workbooks/:id/sheets/:sheetId/roles. */
export interface SheetRolesResponse {
  sheetId: string;
  sheetName: string;
  lock: SheetLock | null;
  overrides: SheetRoleOverride[];
  /** Every member's effective role on the sheet, and why. */
  members: (EffectiveSheetRole & { user: UserRef & { email: string }; workbookRole: WorkbookRole })[];
}
export interface ProtectedRange {
  id: string;
  sheetId: string;
  /** Canonical A1 text: "B2", "A1:C3", "A:C", "2:5". */
  range: string;
  bounds: CellBounds;
  /** Who may edit inside it; always includes its creator. */
  editors: UserRef[];
  createdBy: UserRef;
  createdAt: number;
}
/** Part of GET /api/workbooks/:id, of the `protection` live event, and of lock/range responses. */
export interface Protection {
  locks: SheetLock[];
  /** Per-sheet role overrides; a sheet with none is absent. */
  sheetRoles: SheetRoles[];
  protectedRanges: ProtectedRange[];
}

/** A member's role on one sheet, with the lock or override that made it so. */
export interface SheetStanding extends EffectiveSheetRole {
  lock: SheetLock | null;
  override: SheetRoleOverride | null;
}

/** The one lookup of a member's role on a sheet from a workbook's protection (rule: shared/permissions.ts). */
export function sheetStanding(protection: Protection, who: SheetActor, sheetId: string): SheetStanding {
  const lock = protection.locks.find((l) => l.sheetId === sheetId) ?? null;
  const override = protection.sheetRoles.find((s) => s.sheetId === sheetId)?.overrides.find((o) => o.user.id === who.id) ?? null;
  return { ...effectiveSheetRole(who.role, { locked: lock !== null, override: override?.role ?? null }), lock, override };
}

export type EditBlock = { kind: 'sheet'; sheetId: string; standing: SheetStanding } | { kind: 'range'; range: ProtectedRange };

/**
 * Why `who` may not change this cell, or null when nothing stops them: their role on the sheet, then
 * protected ranges (a finer grain inside a sheet they may edit). The server's patch check and the
 * grid's greyed cells both call this, so they cannot disagree.
 */
export function editBlock(protection: Protection, who: SheetActor, sheetId: string, row: number, col: number): EditBlock | null {
  return sheetEditBlocker(protection, who, sheetId)?.(row, col) ?? null;
}

/**
 * editBlock for many cells of one sheet: the standing and the ranges that bind `who` are looked up
 * once, not per cell (a patch may hold tens of thousands). Null when no cell of the sheet is blocked.
 */
export function sheetEditBlocker(protection: Protection, who: SheetActor, sheetId: string): ((row: number, col: number) => EditBlock | null) | null {
  const standing = sheetStanding(protection, who, sheetId);
  if (standing.role !== 'editor') {
    const block: EditBlock = { kind: 'sheet', sheetId, standing };
    return () => block;
  }
  const binding = protection.protectedRanges.filter((r) => r.sheetId === sheetId && !r.editors.some((e) => e.id === who.id));
  if (binding.length === 0) return null;
  return (row, col) => {
    const range = binding.find((r) => boundsContain(r.bounds, row, col));
    return range ? { kind: 'range', range } : null;
  };
}

/** Whether the sheet itself (name, position, settings, deletion) is closed to `who`: their standing when they only view it. */
export function sheetClosedTo(protection: Protection, who: SheetActor, sheetId: string): SheetStanding | null {
  const standing = sheetStanding(protection, who, sheetId);
  return standing.role === 'editor' ? null : standing;
}

/** Whether `who` edits at least one sheet through an override (so a workbook viewer may still send patches). */
export function editsSomeSheet(protection: Protection, who: SheetActor): boolean {
  return protection.sheetRoles.some((s) => s.overrides.some((o) => o.user.id === who.id && o.role === 'editor'));
}

export type AuditAction =
  | 'member.added'
  | 'member.role_changed'
  | 'member.removed'
  | 'ownership.transferred'
  | 'invitation.created'
  | 'invitation.revoked'
  | 'invitation.accepted'
  | 'sheet.locked'
  | 'sheet.unlocked'
  | 'sheet.role_set'
  | 'sheet.role_removed'
  | 'range.protected'
  | 'range.unprotected'
  | 'revision.restored';
export interface AuditEntry {
  id: number;
  action: AuditAction;
  actor: (UserRef & { email: string }) | null;
  details: Record<string, unknown>;
  createdAt: number;
}
/** GET /api/workbooks/:id/audit (owners and site admins), newest first. */
export interface AuditResponse {
  entries: AuditEntry[];
}

/** GET /api/workbooks/:id/revisions/:n/snapshot: the cell inputs right after revision n. */
export interface RevisionSnapshot {
  revision: number;
  sheets: SheetPayload[];
}

/** GET /api/admin/mail: what the built-in fake SMTP server received, newest first. */
export interface MailMessage {
  id: number;
  from: string;
  to: string;
  subject: string;
  text: string;
  receivedAt: number;
}
export interface MailOutboxResponse {
  messages: MailMessage[];
}

/** GET /api/admin/workbooks: every workbook on the site, most recently changed first (role 'site-admin'). */
export interface AdminWorkbooksResponse {
  workbooks: (WorkbookSummary & { memberCount: number })[];
}

// ---- live updates: GET /api/workbooks/:id/events (text/event-stream) ----

export interface PresenceUser {
  userId: string;
  name: string;
  cell: PresenceInput | null;
}

/** The `data:` JSON of each named event. Revision events carry `id: <revision>` for Last-Event-ID. */
export interface LiveEvents {
  /** First event on every connection. */
  ready: { revision: number; role: AccessRole; actions: WorkbookAction[] };
  revision: { revision: number; kind: RevisionKind; authorId: string; changes: { sheetId: string; row: number; col: number; before: string; after: string }[]; sheetOps: unknown[]; restoredFrom?: number };
  presence: { users: PresenceUser[] };
  protection: Protection;
  /** The caller's role changed (the stream stays open). */
  role: { role: AccessRole; actions: WorkbookAction[] };
  renamed: { title: string };
  /** More revisions were missed than the server replays: load the workbook again. */
  reload: { revision: number };
  /** The workbook was deleted or the caller lost access; the server closes the stream after this. */
  closed: { reason: 'deleted' | 'access_removed' | 'signed_out' };
}
export type LiveEventName = keyof LiveEvents;

/** Events the server's in-process hub carries besides revisions (server/services/events.ts). */
export type TeamEvent = { type: 'protection'; workbookId: string; protection: Protection } | { type: 'members'; workbookId: string };

/** Every event name the stream sends, for EventSource.addEventListener. */
export const liveEventNames = ['ready', 'revision', 'presence', 'protection', 'role', 'renamed', 'reload', 'closed'] as const satisfies readonly LiveEventName[];
