import { and, asc, desc, eq, isNull, or, sql } from 'drizzle-orm';
import type { Db, Tx } from './client';
import {
  equipment,
  events,
  faults,
  positionAssignments,
  positions,
  readings,
  repairs,
  steps,
  strips,
  users,
  velocityCalibrations,
  venues,
} from './schema';

export type EquipmentRow = typeof equipment.$inferSelect;

/** The register itself: items by id or tag, the list, edits and calibrations. */
function registerQueries(db: Db | Tx) {
  return {
    findById: (id: string) => db.select().from(equipment).where(eq(equipment.id, id)).get(),
    findByTag: (orgId: string, assetTag: string) =>
      db
        .select()
        .from(equipment)
        .where(and(eq(equipment.orgId, orgId), eq(equipment.assetTag, assetTag)))
        .get(),
    update: (id: string, patch: Partial<typeof equipment.$inferInsert>) =>
      db.update(equipment).set(patch).where(eq(equipment.id, id)).run(),

    // --- the register (list, create, versioned edit, calibrations, history) ---
    list(
      orgId: string,
      f: { kind?: EquipmentRow['kind'] | undefined; status?: EquipmentRow['status'] | undefined; q?: string | undefined },
    ) {
      const conds = [eq(equipment.orgId, orgId)];
      if (f.kind) conds.push(eq(equipment.kind, f.kind));
      if (f.status) conds.push(eq(equipment.status, f.status));
      if (f.q) {
        const like = `%${f.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
        conds.push(
          sql`(${equipment.assetTag} like ${like} escape '\\' or ${equipment.description} like ${like} escape '\\' or coalesce(${equipment.cableType}, '') like ${like} escape '\\')`,
        );
      }
      return db
        .select()
        .from(equipment)
        .where(and(...conds))
        .orderBy(asc(equipment.assetTag))
        .all();
    },
    insert: (row: typeof equipment.$inferInsert) => db.insert(equipment).values(row).run(),
    /** Writes only if the row is still at the version the caller saw; returns whether it did. */
    updateIfVersion(id: string, version: number, patch: Partial<typeof equipment.$inferInsert>) {
      return (
        db
          .update(equipment)
          .set({ ...patch, version: version + 1 })
          .where(and(eq(equipment.id, id), eq(equipment.version, version)))
          .run().changes === 1
      );
    },
    insertCalibration: (row: typeof velocityCalibrations.$inferInsert) => db.insert(velocityCalibrations).values(row).run(),
    calibrationsOf: (equipmentId: string) =>
      db
        .select({ calibration: velocityCalibrations, byName: users.name })
        .from(velocityCalibrations)
        .leftJoin(users, eq(velocityCalibrations.createdBy, users.id))
        .where(eq(velocityCalibrations.equipmentId, equipmentId))
        .orderBy(desc(velocityCalibrations.createdAt))
        .all(),
  };
}

/** What happened to an item across events: readings, faults, repairs, placements. */
function historyQueries(db: Db | Tx) {
  return {
    readingsOf: (equipmentId: string) =>
      db
        .select({
          reading: readings,
          testKind: steps.testKind,
          conductors: steps.conductors,
          positionName: positions.name,
          stripId: strips.id,
          stripLabel: strips.label,
          venueId: venues.id,
          venueName: venues.name,
          eventName: events.name,
          takenByName: users.name,
        })
        .from(readings)
        .innerJoin(steps, eq(readings.stepId, steps.id))
        .innerJoin(positions, eq(steps.positionId, positions.id))
        .innerJoin(strips, eq(positions.stripId, strips.id))
        .innerJoin(venues, eq(strips.venueId, venues.id))
        .innerJoin(events, eq(venues.eventId, events.id))
        .leftJoin(users, eq(readings.takenBy, users.id))
        .where(eq(readings.equipmentId, equipmentId))
        .orderBy(desc(readings.takenAt))
        .all(),
    faultsOf: (equipmentId: string) =>
      db
        .select({
          fault: faults,
          positionName: positions.name,
          stripLabel: strips.label,
          venueId: venues.id,
          venueName: venues.name,
          eventName: events.name,
        })
        .from(faults)
        .innerJoin(positions, eq(faults.positionId, positions.id))
        .innerJoin(strips, eq(faults.stripId, strips.id))
        .innerJoin(venues, eq(strips.venueId, venues.id))
        .innerJoin(events, eq(venues.eventId, events.id))
        .where(eq(faults.equipmentId, equipmentId))
        .orderBy(desc(faults.openedAt))
        .all(),
    repairsOf: (equipmentId: string) =>
      db
        .select({ repair: repairs, byName: users.name, venueId: strips.venueId })
        .from(repairs)
        .innerJoin(faults, eq(repairs.faultId, faults.id))
        .innerJoin(strips, eq(faults.stripId, strips.id))
        .leftJoin(users, eq(repairs.createdBy, users.id))
        .where(or(eq(repairs.equipmentId, equipmentId), eq(repairs.replacementEquipmentId, equipmentId)))
        .orderBy(asc(repairs.createdAt))
        .all(),
    assignmentsOf: (equipmentId: string) =>
      db
        .select({
          assignment: positionAssignments,
          positionName: positions.name,
          stripId: strips.id,
          stripLabel: strips.label,
          venueId: venues.id,
          venueName: venues.name,
          eventId: events.id,
          eventName: events.name,
          eventStartsOn: events.startsOn,
        })
        .from(positionAssignments)
        .innerJoin(positions, eq(positionAssignments.positionId, positions.id))
        .innerJoin(strips, eq(positions.stripId, strips.id))
        .innerJoin(venues, eq(strips.venueId, venues.id))
        .innerJoin(events, eq(venues.eventId, events.id))
        .where(eq(positionAssignments.equipmentId, equipmentId))
        .orderBy(desc(positionAssignments.assignedAt))
        .all(),
  };
}

/** Where an item sits in a venue, and putting one in a position. */
function placementQueries(db: Db | Tx) {
  return {
    /** The position of the venue the item currently sits in, if any (one item, one place per venue). */
    positionInVenue: (equipmentId: string, venueId: string) =>
      db
        .select({ positionId: positions.id, positionName: positions.name, stripId: strips.id, stripLabel: strips.label })
        .from(positions)
        .innerJoin(strips, eq(positions.stripId, strips.id))
        .where(and(eq(positions.equipmentId, equipmentId), eq(strips.venueId, venueId)))
        .get(),

    /** Puts an item (or nothing) in a position, closing the previous assignment so history stays. */
    assignToPosition(positionId: string, equipmentId: string | null, by: string | null, at: string) {
      db.update(positionAssignments)
        .set({ removedAt: at })
        .where(and(eq(positionAssignments.positionId, positionId), isNull(positionAssignments.removedAt)))
        .run();
      db.update(positions).set({ equipmentId }).where(eq(positions.id, positionId)).run();
      if (equipmentId) {
        db.insert(positionAssignments).values({ id: crypto.randomUUID(), positionId, equipmentId, assignedAt: at, assignedBy: by }).run();
      }
    },
  };
}

// Shared by the register, the venue plan and repairs (swaps and cut-outs).
export function equipmentRepository(db: Db | Tx) {
  return { ...registerQueries(db), ...historyQueries(db), ...placementQueries(db) };
}
