import { and, asc, desc, eq, exists, inArray, isNull, max, or, sql } from 'drizzle-orm';
import type { Db, Tx } from './client';
import {
  equipment,
  events,
  faults,
  positionAssignments,
  positions,
  readings,
  steps,
  strips,
  users,
  venueTechnicians,
  venues,
} from './schema';

export type StripRow = typeof strips.$inferSelect;
export type PositionRow = typeof positions.$inferSelect;
export type StepRow = typeof steps.$inferSelect;

// Events, venues and their plan: strips, positions, steps and technicians.
/** Events, venues and the people of a plan. */
function eventsAndPeople(db: Db | Tx) {
  return {
    // --- events ---
    eventsOfOrg: (orgId: string) =>
      db.select().from(events).where(eq(events.orgId, orgId)).orderBy(desc(events.startsOn), asc(events.name)).all(),
    eventsWithVenueOf: (userId: string) =>
      db
        .selectDistinct({ event: events })
        .from(events)
        .innerJoin(venues, eq(venues.eventId, events.id))
        .innerJoin(venueTechnicians, eq(venueTechnicians.venueId, venues.id))
        .where(eq(venueTechnicians.userId, userId))
        .orderBy(desc(events.startsOn))
        .all()
        .map((r) => r.event),
    findEvent: (id: string) => db.select().from(events).where(eq(events.id, id)).get(),
    insertEvent: (row: typeof events.$inferInsert) => db.insert(events).values(row).run(),
    venuesOfEvent: (eventId: string) => db.select().from(venues).where(eq(venues.eventId, eventId)).orderBy(asc(venues.name)).all(),

    // --- venues ---
    insertVenue: (row: typeof venues.$inferInsert) => db.insert(venues).values(row).run(),
    updateVenue: (id: string, patch: Partial<typeof venues.$inferInsert>) => db.update(venues).set(patch).where(eq(venues.id, id)).run(),
    bumpVersion: (id: string) =>
      db
        .update(venues)
        .set({ version: sql`${venues.version} + 1` })
        .where(eq(venues.id, id))
        .run(),
    versionOf: (id: string) => db.select({ version: venues.version }).from(venues).where(eq(venues.id, id)).get()?.version ?? 0,

    // --- people ---
    usersByIds: (ids: string[]) => (ids.length === 0 ? [] : db.select().from(users).where(inArray(users.id, ids)).all()),
    findUser: (id: string) => db.select().from(users).where(eq(users.id, id)).get(),
    activePeopleOfOrg: (orgId: string) =>
      db
        .select({ id: users.id, name: users.name, email: users.email, role: users.role })
        .from(users)
        .where(and(eq(users.orgId, orgId), eq(users.disabled, false)))
        .orderBy(asc(users.name))
        .all(),
    techniciansOf: (venueId: string) =>
      db
        .select({ id: users.id, name: users.name, email: users.email })
        .from(venueTechnicians)
        .innerJoin(users, eq(venueTechnicians.userId, users.id))
        .where(eq(venueTechnicians.venueId, venueId))
        .orderBy(asc(users.name))
        .all(),
    setTechnicians(venueId: string, userIds: string[]) {
      db.delete(venueTechnicians).where(eq(venueTechnicians.venueId, venueId)).run();
      if (userIds.length)
        db.insert(venueTechnicians)
          .values(userIds.map((userId) => ({ venueId, userId })))
          .run();
    },
  };
}

/** Strips of a venue. */
function stripQueries(db: Db | Tx) {
  return {
    // --- strips ---
    // The pool of spares is not part of the plan.
    stripsOf: (venueId: string) =>
      db
        .select()
        .from(strips)
        .where(and(eq(strips.venueId, venueId), eq(strips.sparePool, false)))
        .orderBy(asc(strips.sortOrder), asc(strips.label))
        .all(),
    findStrip: (id: string) => db.select().from(strips).where(eq(strips.id, id)).get(),
    stripByLabel: (venueId: string, label: string) =>
      db
        .select()
        .from(strips)
        .where(and(eq(strips.venueId, venueId), eq(strips.label, label)))
        .get(),
    maxStripSort: (venueId: string) =>
      db
        .select({ m: max(strips.sortOrder) })
        .from(strips)
        .where(eq(strips.venueId, venueId))
        .get()?.m ?? 0,
    insertStrip: (row: typeof strips.$inferInsert) => db.insert(strips).values(row).run(),
    updateStrip: (id: string, patch: Partial<typeof strips.$inferInsert>) => db.update(strips).set(patch).where(eq(strips.id, id)).run(),
  };
}

/** Positions of strips. */
function positionQueries(db: Db | Tx) {
  return {
    // --- positions ---
    positionsOfVenue: (venueId: string) =>
      db
        .select({ position: positions, equipment })
        .from(positions)
        .innerJoin(strips, eq(positions.stripId, strips.id))
        .leftJoin(equipment, eq(positions.equipmentId, equipment.id))
        .where(eq(strips.venueId, venueId))
        .orderBy(asc(positions.sortOrder))
        .all(),
    positionsOfStrip: (stripId: string) =>
      db.select().from(positions).where(eq(positions.stripId, stripId)).orderBy(asc(positions.sortOrder)).all(),
    findPosition: (id: string) =>
      db
        .select({ position: positions, strip: strips })
        .from(positions)
        .innerJoin(strips, eq(positions.stripId, strips.id))
        .where(eq(positions.id, id))
        .get(),
    insertPosition: (row: typeof positions.$inferInsert) => db.insert(positions).values(row).run(),
    maxPositionSort: (stripId: string) =>
      db
        .select({ m: max(positions.sortOrder) })
        .from(positions)
        .where(eq(positions.stripId, stripId))
        .get()?.m ?? 0,
    /** Positions of the venue with a reading on any of their steps or a fault recorded against them. */
  };
}

/** What was recorded against positions, and taking an untested one away. */
function positionRecordQueries(db: Db | Tx) {
  return {
    testedPositionsOfVenue(venueId: string) {
      const tested = or(
        exists(
          db
            .select({ x: sql`1` })
            .from(steps)
            .innerJoin(readings, eq(readings.stepId, steps.id))
            .where(eq(steps.positionId, positions.id)),
        ),
        exists(
          db
            .select({ x: sql`1` })
            .from(faults)
            .where(eq(faults.positionId, positions.id)),
        ),
      );
      return new Set(
        db
          .select({ id: positions.id })
          .from(positions)
          .innerJoin(strips, eq(positions.stripId, strips.id))
          .where(and(eq(strips.venueId, venueId), tested))
          .all()
          .map((r) => r.id),
      );
    },
    /** What a technician recorded against one position: readings on its steps, and faults on it or its steps. */
    recordsOfPosition(positionId: string) {
      const stepIds = db.select({ id: steps.id }).from(steps).where(eq(steps.positionId, positionId));
      const readingCount =
        db
          .select({ n: sql<number>`count(*)` })
          .from(readings)
          .where(inArray(readings.stepId, stepIds))
          .get()?.n ?? 0;
      const faultCount =
        db
          .select({ n: sql<number>`count(*)` })
          .from(faults)
          .where(or(eq(faults.positionId, positionId), inArray(faults.stepId, stepIds)))
          .get()?.n ?? 0;
      return { readings: readingCount, faults: faultCount };
    },
    /** Which items sat in the position and when (its own rows of the placement history). */
    assignmentsOfPosition: (positionId: string) =>
      db
        .select({ assetTag: equipment.assetTag, assignedAt: positionAssignments.assignedAt, removedAt: positionAssignments.removedAt })
        .from(positionAssignments)
        .innerJoin(equipment, eq(positionAssignments.equipmentId, equipment.id))
        .where(eq(positionAssignments.positionId, positionId))
        .orderBy(asc(positionAssignments.assignedAt))
        .all(),
    /** Deletes a position with its steps and placement rows; only for a position nothing was recorded against. */
    deletePosition(positionId: string) {
      db.delete(steps).where(eq(steps.positionId, positionId)).run();
      db.delete(positionAssignments).where(eq(positionAssignments.positionId, positionId)).run();
      db.delete(positions).where(eq(positions.id, positionId)).run();
    },
  };
}

/** Checklist steps of positions. */
function stepQueries(db: Db | Tx) {
  return {
    // --- steps ---
    stepsOfVenue: (venueId: string) =>
      db
        .select({ step: steps })
        .from(steps)
        .innerJoin(positions, eq(steps.positionId, positions.id))
        .innerJoin(strips, eq(positions.stripId, strips.id))
        .where(eq(strips.venueId, venueId))
        .orderBy(asc(steps.sortOrder))
        .all()
        .map((r) => r.step),
    stepsOfPosition: (positionId: string) =>
      db.select().from(steps).where(eq(steps.positionId, positionId)).orderBy(asc(steps.sortOrder)).all(),
    activeStepsOf: (positionId: string) =>
      db
        .select()
        .from(steps)
        .where(and(eq(steps.positionId, positionId), isNull(steps.removedAt)))
        .orderBy(asc(steps.sortOrder))
        .all(),
    maxStepSort: (positionId: string) =>
      db
        .select({ m: max(steps.sortOrder) })
        .from(steps)
        .where(eq(steps.positionId, positionId))
        .get()?.m ?? 0,
    findStep: (id: string) =>
      db
        .select({ step: steps, position: positions, strip: strips })
        .from(steps)
        .innerJoin(positions, eq(steps.positionId, positions.id))
        .innerJoin(strips, eq(positions.stripId, strips.id))
        .where(eq(steps.id, id))
        .get(),
    insertStep: (row: typeof steps.$inferInsert) => db.insert(steps).values(row).run(),
    removeStep: (id: string, at: string) => db.update(steps).set({ removedAt: at }).where(eq(steps.id, id)).run(),
  };
}

export function planRepository(db: Db | Tx) {
  return { ...eventsAndPeople(db), ...stripQueries(db), ...positionQueries(db), ...positionRecordQueries(db), ...stepQueries(db) };
}
