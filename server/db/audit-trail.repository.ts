import { and, desc, eq, sql, type SQL } from 'drizzle-orm';
import type { Db, Tx } from './client';
import { auditLog, users } from './schema';

// Reading the audit log back, with who did it. Writing stays in audit.repository.ts (recordAudit).
export function auditTrailRepository(db: Db | Tx) {
  const select = (where: SQL | undefined, limit: number) =>
    db
      .select({
        id: auditLog.id,
        at: auditLog.at,
        action: auditLog.action,
        entityType: auditLog.entityType,
        entityId: auditLog.entityId,
        detailJson: auditLog.detailJson,
        actorId: auditLog.actorId,
        actorName: users.name,
      })
      .from(auditLog)
      .leftJoin(users, eq(auditLog.actorId, users.id))
      .where(where)
      .orderBy(desc(auditLog.id))
      .limit(limit)
      .all();

  return {
    list(f: { orgId: string; entityType?: string | undefined; entityId?: string | undefined }, limit = 500) {
      const conds = [eq(auditLog.orgId, f.orgId)];
      if (f.entityType) conds.push(eq(auditLog.entityType, f.entityType));
      if (f.entityId) conds.push(eq(auditLog.entityId, f.entityId));
      return select(and(...conds), limit);
    },
    /** The venue itself, its strips, positions, steps, readings, faults and repairs, and anything naming it. */
    ofVenue(orgId: string, venueId: string, limit = 2000) {
      return select(
        and(
          eq(auditLog.orgId, orgId),
          sql`(
            ${auditLog.entityId} = ${venueId}
            or json_extract(${auditLog.detailJson}, '$.venueId') = ${venueId}
            or ${auditLog.entityId} in (select s.id from strips s where s.venue_id = ${venueId})
            or ${auditLog.entityId} in (select p.id from positions p join strips s on p.strip_id = s.id where s.venue_id = ${venueId})
            or ${auditLog.entityId} in (select st.id from steps st join positions p on st.position_id = p.id join strips s on p.strip_id = s.id where s.venue_id = ${venueId})
            or ${auditLog.entityId} in (select r.id from readings r join steps st on r.step_id = st.id join positions p on st.position_id = p.id join strips s on p.strip_id = s.id where s.venue_id = ${venueId})
            or ${auditLog.entityId} in (select f.id from faults f join strips s on f.strip_id = s.id where s.venue_id = ${venueId})
            or ${auditLog.entityId} in (select rp.id from repairs rp join faults f on rp.fault_id = f.id join strips s on f.strip_id = s.id where s.venue_id = ${venueId})
          )`,
        ),
        limit,
      );
    },
  };
}
