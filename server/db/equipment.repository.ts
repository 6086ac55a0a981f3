import { and, eq, isNull } from 'drizzle-orm';
import type { Db, Tx } from './client';
import { equipment, positionAssignments, positions } from './schema';

export type EquipmentRow = typeof equipment.$inferSelect;

// Shared by the register, the venue plan and repairs (swaps and cut-outs).
export function equipmentRepository(db: Db | Tx) {
  return {
    findById: (id: string) => db.select().from(equipment).where(eq(equipment.id, id)).get(),
    findByTag: (orgId: string, assetTag: string) =>
      db.select().from(equipment).where(and(eq(equipment.orgId, orgId), eq(equipment.assetTag, assetTag))).get(),
    update: (id: string, patch: Partial<typeof equipment.$inferInsert>) =>
      db.update(equipment).set(patch).where(eq(equipment.id, id)).run(),

    /** Puts an item (or nothing) in a position, closing the previous assignment so history stays. */
    assignToPosition(positionId: string, equipmentId: string | null, by: string | null, at: string) {
      db.update(positionAssignments)
        .set({ removedAt: at })
        .where(and(eq(positionAssignments.positionId, positionId), isNull(positionAssignments.removedAt)))
        .run();
      db.update(positions).set({ equipmentId }).where(eq(positions.id, positionId)).run();
      if (equipmentId) {
        db.insert(positionAssignments)
          .values({ id: crypto.randomUUID(), positionId, equipmentId, assignedAt: at, assignedBy: by })
          .run();
      }
    },
  };
}
