import type { Db, Tx } from './client';
import { auditLog } from './schema';
import { columnsKey, placeholdersOf, prepared } from './prepared';
import { and, desc, eq } from 'drizzle-orm';

export interface AuditEntry {
  orgId: string | null;
  actorId: string | null;
  action: string;
  entityType: string;
  entityId: string;
  detail?: Record<string, unknown>;
}

// Called inside the same transaction as the change it records.
function writeAudit(db: Db | Tx, e: AuditEntry) {
  const row = {
    orgId: e.orgId,
    actorId: e.actorId,
    action: e.action,
    entityType: e.entityType,
    entityId: e.entityId,
    detailJson: JSON.stringify(e.detail ?? {}),
  };
  prepared(db, `audit.insert:${columnsKey(row)}`, (d) => d.insert(auditLog).values(placeholdersOf(row)).prepare()).run(row);
}

/** Who made a change: a signed-in person (an AuthUser fits), or the organisation and id of one. */
export interface AuditActor {
  orgId: string | null;
  id: string | null;
}

/** The one way services record what a person did, in the transaction of the change itself. */
export function recordAudit(
  db: Db | Tx,
  actor: AuditActor,
  action: string,
  entityType: string,
  entityId: string,
  detail?: Record<string, unknown>,
) {
  writeAudit(db, { orgId: actor.orgId, actorId: actor.id, action, entityType, entityId, detail });
}

export function listAudit(db: Db, filter: { orgId: string; entityType?: string; entityId?: string }, limit = 200) {
  const conds = [eq(auditLog.orgId, filter.orgId)];
  if (filter.entityType) conds.push(eq(auditLog.entityType, filter.entityType));
  if (filter.entityId) conds.push(eq(auditLog.entityId, filter.entityId));
  return db
    .select()
    .from(auditLog)
    .where(and(...conds))
    .orderBy(desc(auditLog.id))
    .limit(limit)
    .all();
}
