import { and, asc, eq } from 'drizzle-orm';
import type { Db, Tx } from './client';
import { attachments, equipment, faults, idempotencyKeys, repairs, strips, users } from './schema';

export type AttachmentRow = typeof attachments.$inferSelect;
export type IdempotencyRow = typeof idempotencyKeys.$inferSelect;

export function attachmentsRepository(db: Db | Tx) {
  return {
    findById: (id: string) =>
      db
        .select({ attachment: attachments, createdByName: users.name })
        .from(attachments)
        .leftJoin(users, eq(attachments.createdBy, users.id))
        .where(eq(attachments.id, id))
        .get(),
    ofOwner: (ownerType: AttachmentRow['ownerType'], ownerId: string) =>
      db
        .select({ attachment: attachments, createdByName: users.name })
        .from(attachments)
        .leftJoin(users, eq(attachments.createdBy, users.id))
        .where(and(eq(attachments.ownerType, ownerType), eq(attachments.ownerId, ownerId)))
        .orderBy(asc(attachments.createdAt))
        .all(),
    sameBytes: (ownerType: AttachmentRow['ownerType'], ownerId: string, sha256: string) =>
      db
        .select()
        .from(attachments)
        .where(and(eq(attachments.ownerType, ownerType), eq(attachments.ownerId, ownerId), eq(attachments.sha256, sha256)))
        .get(),
    insert: (row: typeof attachments.$inferInsert) => db.insert(attachments).values(row).run(),

    // --- what an attachment hangs on: the venue (faults, repairs) or the organisation (items) ---
    faultOwner: (faultId: string) =>
      db
        .select({ id: faults.id, venueId: strips.venueId, equipment })
        .from(faults)
        .innerJoin(strips, eq(faults.stripId, strips.id))
        .leftJoin(equipment, eq(faults.equipmentId, equipment.id))
        .where(eq(faults.id, faultId))
        .get(),
    repairOwner: (repairId: string) =>
      db
        .select({ id: repairs.id, faultId: repairs.faultId, venueId: strips.venueId, equipment })
        .from(repairs)
        .innerJoin(faults, eq(repairs.faultId, faults.id))
        .innerJoin(strips, eq(faults.stripId, strips.id))
        .leftJoin(equipment, eq(repairs.equipmentId, equipment.id))
        .where(eq(repairs.id, repairId))
        .get(),
    equipmentOwner: (equipmentId: string) => db.select().from(equipment).where(eq(equipment.id, equipmentId)).get(),

    // --- Idempotency-Key replays ---
    findIdempotency: (key: string) => db.select().from(idempotencyKeys).where(eq(idempotencyKeys.key, key)).get(),
    insertIdempotency: (row: typeof idempotencyKeys.$inferInsert) => db.insert(idempotencyKeys).values(row).run(),
  };
}
