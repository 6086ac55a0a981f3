import { and, asc, desc, eq, inArray, isNull, sql } from 'drizzle-orm';
import type { Db, Tx } from './client';
import { equipment, events, limitProfiles, positions, readings, steps, strips, users, venues } from './schema';
import { prepared } from './prepared';

export type StepRow = typeof steps.$inferSelect;
export type PositionRow = typeof positions.$inferSelect;
export type StripRow = typeof strips.$inferSelect;
export type ReadingRow = typeof readings.$inferSelect;
export type LimitProfileRow = typeof limitProfiles.$inferSelect;

// Latest first by time taken, ties broken by insertion order: a correction wins over what it corrects.
const latestFirst = [desc(readings.takenAt), desc(sql`${readings}.rowid`)] as const;

export function stripsRepository(db: Db | Tx) {
  return {
    findStrip: (id: string) =>
      db
        .select({ strip: strips, venue: venues, event: events })
        .from(strips)
        .innerJoin(venues, eq(strips.venueId, venues.id))
        .innerJoin(events, eq(venues.eventId, events.id))
        .where(eq(strips.id, id))
        .get(),

    /** A step with everything needed to judge a reading on it. */
    stepContext: (stepId: string) =>
      prepared(db, 'strips.stepContext', (d) =>
        d
          .select({ step: steps, position: positions, strip: strips, venue: venues, event: events, equipment })
          .from(steps)
          .innerJoin(positions, eq(steps.positionId, positions.id))
          .innerJoin(strips, eq(positions.stripId, strips.id))
          .innerJoin(venues, eq(strips.venueId, venues.id))
          .innerJoin(events, eq(venues.eventId, events.id))
          .leftJoin(equipment, eq(positions.equipmentId, equipment.id))
          .where(eq(steps.id, sql.placeholder('stepId')))
          .prepare(),
      ).get({ stepId }),

    positionContext: (positionId: string) =>
      db
        .select({ position: positions, strip: strips, venue: venues, event: events, equipment })
        .from(positions)
        .innerJoin(strips, eq(positions.stripId, strips.id))
        .innerJoin(venues, eq(strips.venueId, venues.id))
        .innerJoin(events, eq(venues.eventId, events.id))
        .leftJoin(equipment, eq(positions.equipmentId, equipment.id))
        .where(eq(positions.id, positionId))
        .get(),

    profile: (id: string) =>
      prepared(db, 'strips.profile', (d) =>
        d
          .select()
          .from(limitProfiles)
          .where(eq(limitProfiles.id, sql.placeholder('id')))
          .prepare(),
      ).get({ id }),

    positionsWithEquipment: (stripId: string) =>
      db
        .select({ position: positions, equipment })
        .from(positions)
        .leftJoin(equipment, eq(positions.equipmentId, equipment.id))
        .where(eq(positions.stripId, stripId))
        .orderBy(asc(positions.sortOrder))
        .all(),

    activeStepsOf: (positionIds: string[]) =>
      positionIds.length === 0
        ? []
        : db
            .select()
            .from(steps)
            .where(and(inArray(steps.positionId, positionIds), isNull(steps.removedAt)))
            .orderBy(asc(steps.sortOrder))
            .all(),

    /** Every reading of the given steps, latest first, with the name of who took it. */
    readingsOfSteps: (stepIds: string[]) =>
      stepIds.length === 0
        ? []
        : db
            .select({ reading: readings, takenByName: users.name })
            .from(readings)
            .leftJoin(users, eq(readings.takenBy, users.id))
            .where(inArray(readings.stepId, stepIds))
            .orderBy(...latestFirst)
            .all(),

    /** The strips of a venue in order, for "previous / next strip". */
    stripIdsOfVenue: (venueId: string) =>
      db
        .select({ id: strips.id, label: strips.label })
        .from(strips)
        .where(and(eq(strips.venueId, venueId), eq(strips.sparePool, false)))
        .orderBy(asc(strips.sortOrder))
        .all(),
  };
}

/** The latest reading of each step, from a latest-first list. */
export function latestByStep<T extends { reading: ReadingRow }>(rows: T[]): Map<string, T> {
  const out = new Map<string, T>();
  for (const row of rows) if (!out.has(row.reading.stepId)) out.set(row.reading.stepId, row);
  return out;
}
