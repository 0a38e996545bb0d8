// One audit entry as a sentence. Details are what the server recorded at the time (shared/team.ts
// AuditAction); people named only by id are looked up among today's members, else called "a
// former member" — the log itself never changes.
import { roleInSentence } from '@shared/permissions.js';
import type { AuditEntry } from '@shared/team.js';

type Details = Record<string, unknown>;
const text = (v: unknown, fallback = '?') => (typeof v === 'string' && v !== '' ? v : fallback);
const article = (role: unknown) => (role === 'owner' ? 'the owner' : roleInSentence(role));

export function describeAudit(entry: AuditEntry, nameOf: (userId: string) => string | undefined): string {
  const d: Details = entry.details;
  const person = (id: unknown, email?: unknown) => (typeof id === 'string' && nameOf(id)) || (typeof email === 'string' ? email : 'a former member');
  const where = `on sheet “${text(d.sheetName)}”`;
  switch (entry.action) {
    case 'member.added':
      return `added ${person(d.userId, d.email)} as ${article(d.role)}`;
    case 'member.role_changed':
      return `changed ${person(d.userId)} from ${text(d.from)} to ${text(d.to)}`;
    case 'member.removed':
      return d.left === true ? `left the workbook (was ${article(d.role)})` : `removed ${person(d.userId, d.email)} (was ${article(d.role)})`;
    case 'ownership.transferred':
      return `handed ownership to ${person(d.to)}`;
    case 'invitation.created':
      return `invited ${text(d.email)} by e-mail as ${article(d.role)}`;
    case 'invitation.revoked':
      return `withdrew the invitation to ${text(d.email)}`;
    case 'invitation.accepted':
      return `accepted the invitation sent to ${text(d.email)} and joined as ${article(d.role)}`;
    case 'sheet.locked':
      return `${d.replaced === true ? 'changed the lock of' : 'locked'} sheet “${text(d.sheetName)}”: “${text(d.reason)}”`;
    case 'sheet.unlocked':
      return `unlocked sheet “${text(d.sheetName)}” (locked for “${text(d.reason)}”)`;
    case 'sheet.role_set':
      return `made ${person(d.userId, d.name)} ${d.role === 'editor' ? 'an editor' : 'a viewer'} ${where}${d.before ? ` (was ${d.before === 'editor' ? 'an editor' : 'a viewer'} there)` : ''}`;
    case 'sheet.role_removed':
      return `set ${person(d.userId, d.name)} back to their workbook role ${where}`;
    case 'range.protected':
      return `protected ${text(d.range)} ${where}`;
    case 'range.unprotected':
      return `removed the protection of ${text(d.range)} ${where}`;
    case 'revision.restored':
      return d.sheetName !== undefined
        ? `brought back sheet “${text(d.sheetName)}” as it was after revision #${String(d.restoredFrom)}, as revision #${String(d.revision)}`
        : `restored revision #${String(d.restoredFrom)} as revision #${String(d.revision)}`;
    default:
      return String(entry.action);
  }
}
