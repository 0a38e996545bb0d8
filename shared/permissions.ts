// Who may do what to a workbook, as plain data. The server checks every request against this table
// (server/services/access.ts is the only caller there); the client reads it to show or hide controls.
// Widening access (sharing, locks) means editing this table, not scattering role checks in routes.
import type { SiteRole } from './auth.js';

export const workbookRoles = ['owner', 'editor', 'viewer'] as const;
export type WorkbookRole = (typeof workbookRoles)[number];

/**
 * The role a request acts with: a member's role, or 'site-admin' for a site admin who is not a
 * member (site admins may look at every workbook, without editing it).
 */
export type AccessRole = WorkbookRole | 'site-admin';

/** Every action on a workbook, with the words a refusal uses ("… cannot edit cells"). */
export const workbookActions = {
  view: 'open this workbook',
  viewHistory: 'see the revision history',
  export: 'export this workbook',
  editCells: 'edit cells',
  editSheets: 'add, rename, move or delete sheets',
  restore: 'restore an earlier revision',
  rename: 'rename this workbook',
  delete: 'delete this workbook',
  manageMembers: 'share this workbook or change its members',
  transferOwnership: 'transfer ownership',
  /** Sheet locks and protected ranges on any sheet. */
  lockAnySheet: 'lock sheets or protect ranges',
  /** Sheet locks and protected ranges on a sheet the user created. */
  lockOwnSheet: 'lock their own sheets or protect ranges on them',
  viewAudit: 'see the audit log',
} as const;
export type WorkbookAction = keyof typeof workbookActions;

const readOnly: readonly WorkbookAction[] = ['view', 'viewHistory', 'export'];

export const permissionTable: Record<AccessRole, readonly WorkbookAction[]> = {
  owner: Object.keys(workbookActions) as WorkbookAction[],
  editor: [...readOnly, 'editCells', 'editSheets', 'restore', 'lockOwnSheet'],
  viewer: readOnly,
  'site-admin': [...readOnly, 'viewAudit'],
};

export function can(role: AccessRole | null | undefined, action: WorkbookAction): boolean {
  return role != null && permissionTable[role].includes(action);
}

/** The roles a user acts with: a site admin who is also a member keeps both sets of rights. */
export function accessRoles(memberRole: WorkbookRole | null, siteRole: SiteRole): AccessRole[] {
  const roles: AccessRole[] = memberRole ? [memberRole] : [];
  if (siteRole === 'admin') roles.push('site-admin');
  return roles;
}

export function canAny(roles: readonly AccessRole[], action: WorkbookAction): boolean {
  return roles.some((r) => can(r, action));
}

/**
 * Everything a user may do with all their roles together: what the server decides with, sent to the
 * client so that it shows exactly the controls the server will accept.
 */
export function allowedActions(roles: readonly AccessRole[]): WorkbookAction[] {
  return (Object.keys(workbookActions) as WorkbookAction[]).filter((action) => canAny(roles, action));
}

/** Whether a list of allowed actions (from the server) includes this one. */
export function allows(actions: readonly WorkbookAction[] | undefined, action: WorkbookAction): boolean {
  return actions?.includes(action) ?? false;
}

/** Each role in words, the one place they are written: as a label, and as a sentence says it. */
export const roleLabels: Record<AccessRole, string> = { owner: 'Owner', editor: 'Editor', viewer: 'Viewer', 'site-admin': 'Site admin' };
const roleNames: Record<AccessRole, string> = { owner: 'an owner', editor: 'an editor', viewer: 'a viewer', 'site-admin': 'a site admin' };

/** "an editor"; a role this version does not know (an old audit entry) is named as recorded. */
export function roleInSentence(role: unknown): string {
  return typeof role === 'string' && role in roleNames ? roleNames[role as AccessRole] : `a ${typeof role === 'string' && role ? role : '?'}`;
}

/** The reason a 403 gives: "as a viewer you cannot edit cells". */
export function refusalReason(role: AccessRole, action: WorkbookAction): string {
  return `as ${roleNames[role]} you cannot ${workbookActions[action]}`;
}

// ---- roles per sheet ----
// A member's role on one sheet: their workbook role unless the sheet says otherwise. A sheet may
// name a member editor or viewer (an override, either way), and a locked sheet makes everyone a
// viewer except those it names editor. This function is the whole rule; the server's lookup
// (server/services/access.ts), the patch transaction, imports, restores, tab changes and the grid's
// greying all come through it.

export const sheetRoleNames = ['editor', 'viewer'] as const;
export type SheetRole = (typeof sheetRoleNames)[number];

/** Why a member has the role they have on a sheet. */
export type SheetRoleSource = 'workbook' | 'override' | 'lock';

/** What a sheet says about one member: whether the sheet is locked, and their override if any. */
export interface SheetRoleRule {
  locked: boolean;
  override: SheetRole | null;
}

export interface EffectiveSheetRole {
  role: SheetRole;
  source: SheetRoleSource;
}

/**
 * The role a member acts with on one sheet. An override wins in either direction; otherwise a
 * workbook viewer views, a lock makes a workbook editor or owner a viewer, and the workbook role
 * holds. Someone with no membership (a site admin looking in) views. Owners keep every workbook
 * right, so a lock never shuts them out for long: they may name themselves editor at any time.
 */
export function effectiveSheetRole(memberRole: WorkbookRole | null, rule: SheetRoleRule): EffectiveSheetRole {
  if (memberRole === null) return { role: 'viewer', source: 'workbook' };
  if (rule.override) return { role: rule.override, source: 'override' };
  if (memberRole === 'viewer') return { role: 'viewer', source: 'workbook' };
  if (rule.locked) return { role: 'viewer', source: 'lock' };
  return { role: 'editor', source: 'workbook' };
}

/** Actions that a sheet role decides, sheet by sheet, with the words a refusal uses. */
export const sheetActions = {
  editCells: 'edit cells on',
  changeSheet: 'rename, move, re-configure or delete',
} as const;
export type SheetAction = keyof typeof sheetActions;

export function canOnSheet(role: SheetRole, _action: SheetAction): boolean {
  return role === 'editor';
}

const sourceWords: Record<SheetRoleSource, string> = {
  workbook: 'your role in this workbook',
  override: 'the role this sheet gives you',
  lock: 'the sheet is locked',
};

/** The reason a refusal on a sheet gives: `as a viewer of "Settled" (the sheet is locked) you cannot edit cells on it`. */
export function sheetRefusalReason(sheetName: string, effective: EffectiveSheetRole, action: SheetAction): string {
  return `you are a viewer of sheet "${sheetName}" (${sourceWords[effective.source]}), so you cannot ${sheetActions[action]} it`;
}

/**
 * Why a user may not lock, protect ranges on or set roles on a sheet, or null when they may: owners
 * on any sheet; editors on sheets they created and still edit, and only what they set themselves
 * (`setBy`, when replacing or lifting). Without a sheet, checks the workbook role alone. The server
 * refuses with this reason and the client disables its controls with it.
 */
export function sheetManageRefusal(
  roles: readonly AccessRole[],
  userId: string,
  sheet?: { name: string; createdBy?: string | null },
  opts: { setBy?: string; myRoleOnSheet?: SheetRole } = {},
): string | null {
  if (canAny(roles, 'lockAnySheet')) return null;
  if (!canAny(roles, 'lockOwnSheet')) return refusalReason(roles[0] ?? 'viewer', 'lockAnySheet');
  if (!sheet) return null;
  if (sheet.createdBy !== userId) return `as an editor you can lock, protect or give roles only on sheets you created, and "${sheet.name}" is someone else's; ask an owner`;
  if (opts.myRoleOnSheet && opts.myRoleOnSheet !== 'editor') return `you are a viewer of "${sheet.name}" now, so you cannot change who may edit it; ask an owner`;
  if (opts.setBy !== undefined && opts.setBy !== userId) return `as an editor you cannot change or lift what someone else set on "${sheet.name}"; ask them or an owner`;
  return null;
}
