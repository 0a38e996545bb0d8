// The audit log of a workbook's sharing, roles, locks and restores: written in the same transaction
// as the change it records (so it cannot claim what did not happen), read by owners and site admins.
import { and, desc, eq, lt } from 'drizzle-orm';
import type { AuditAction, AuditEntry } from '../../shared/team.js';
import type { Db } from '../db/index.js';
import { auditLog, users } from '../db/schema.js';
import type { Tx } from './cellStore.js';

export function recordAudit(tx: Tx | Db, workbookId: string, actorId: string, action: AuditAction, details: Record<string, unknown>): void {
  tx.insert(auditLog).values({ workbookId, actorId, action, details }).run();
}

export function listAudit(db: Db, workbookId: string, opts: { before?: number; limit: number }): AuditEntry[] {
  const where = opts.before !== undefined ? and(eq(auditLog.workbookId, workbookId), lt(auditLog.id, opts.before)) : eq(auditLog.workbookId, workbookId);
  return db
    .select({ id: auditLog.id, action: auditLog.action, details: auditLog.details, createdAt: auditLog.createdAt, actorId: auditLog.actorId, name: users.name, email: users.email })
    .from(auditLog)
    .leftJoin(users, eq(users.id, auditLog.actorId))
    .where(where)
    .orderBy(desc(auditLog.id))
    .limit(opts.limit)
    .all()
    .map((r) => ({
      id: r.id,
      action: r.action as AuditAction,
      actor: r.actorId ? { id: r.actorId, name: r.name ?? '', email: r.email ?? '' } : null,
      details: r.details,
      createdAt: r.createdAt,
    }));
}
