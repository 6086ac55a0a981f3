import { and, asc, eq, inArray, isNull, ne, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';
import type { Db, Tx } from './client';
import { equipment, faults, limitProfiles, organisations, positions, readings, signOffs, steps, strips, users, venues } from './schema';

export type SignOffRow = typeof signOffs.$inferSelect;

const readingEquipment = alias(equipment, 'reading_equipment');

export function signOffRepository(db: Db | Tx) {
  return {
    /**
     * Every active step of the venue with its strip, position, current item and the latest reading
     * (latest by time taken, ties broken by insertion order: corrections supersede).
     */
    stepsWithLatestReading: (venueId: string) =>
      db
        .select({
          stripId: strips.id,
          positionId: positions.id,
          positionName: positions.name,
          positionSort: positions.sortOrder,
          equipmentKind: positions.equipmentKind,
          positionEquipmentId: positions.equipmentId,
          positionAssetTag: equipment.assetTag,
          stepId: steps.id,
          testKind: steps.testKind,
          conductors: steps.conductors,
          required: steps.required,
          stepSort: steps.sortOrder,
          reading: readings,
          readingAssetTag: readingEquipment.assetTag,
          takenByName: users.name,
        })
        .from(steps)
        .innerJoin(positions, eq(steps.positionId, positions.id))
        .innerJoin(strips, eq(positions.stripId, strips.id))
        .leftJoin(equipment, eq(positions.equipmentId, equipment.id))
        .leftJoin(
          readings,
          eq(readings.id, sql`(select r.id from readings r where r.step_id = ${steps.id} order by r.taken_at desc, r.rowid desc limit 1)`),
        )
        .leftJoin(readingEquipment, eq(readings.equipmentId, readingEquipment.id))
        .leftJoin(users, eq(readings.takenBy, users.id))
        .where(and(eq(strips.venueId, venueId), isNull(steps.removedAt)))
        .orderBy(asc(strips.sortOrder), asc(positions.sortOrder), asc(steps.sortOrder))
        .all(),

    openFaultsOf: (venueId: string) =>
      db
        .select({
          faultId: faults.id,
          stripId: faults.stripId,
          positionName: positions.name,
          kind: faults.kind,
          conductors: faults.conductors,
          status: faults.status,
        })
        .from(faults)
        .innerJoin(strips, eq(faults.stripId, strips.id))
        .innerJoin(positions, eq(faults.positionId, positions.id))
        .where(and(eq(strips.venueId, venueId), ne(faults.status, 'closed')))
        .all(),

    profile: (id: string) => db.select().from(limitProfiles).where(eq(limitProfiles.id, id)).get(),
    organisation: (id: string) => db.select().from(organisations).where(eq(organisations.id, id)).get(),
    user: (id: string) => db.select().from(users).where(eq(users.id, id)).get(),
    usersByIds: (ids: string[]) =>
      ids.length === 0
        ? []
        : db.select({ id: users.id, name: users.name, email: users.email }).from(users).where(inArray(users.id, ids)).all(),

    insertSignOff: (row: typeof signOffs.$inferInsert) => db.insert(signOffs).values(row).run(),
    /** The venue freezes: signed off, and its version moves on so stale plan edits are refused. */
    markVenueSignedOff: (venueId: string, fromVersion: number) =>
      db
        .update(venues)
        .set({ status: 'signed-off', version: fromVersion + 1 })
        .where(and(eq(venues.id, venueId), eq(venues.version, fromVersion)))
        .run().changes,
    activeSignOff: (venueId: string) =>
      db
        .select()
        .from(signOffs)
        .where(and(eq(signOffs.venueId, venueId), eq(signOffs.status, 'active')))
        .get(),
  };
}
export type SignOffRepository = ReturnType<typeof signOffRepository>;
