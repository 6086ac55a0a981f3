import { eq, sql } from 'drizzle-orm';
import type { Db, Tx } from './client';
import { equipment, events, positions, readings, steps, strips, users, venues } from './schema';
import { columnsKey, placeholdersOf, prepared } from './prepared';

export type NewReading = typeof readings.$inferInsert;

// Readings are append-only: there is no update or delete here on purpose.
export function readingsRepository(db: Db | Tx) {
  return {
    findById: (id: string) =>
      prepared(db, 'readings.findById', (d) =>
        d
          .select({ reading: readings, takenByName: users.name })
          .from(readings)
          .leftJoin(users, eq(readings.takenBy, users.id))
          .where(eq(readings.id, sql.placeholder('id')))
          .prepare(),
      ).get({ id }),

    /**
     * Everything recording a reading on a step needs, in one query: the step and where it sits, who
     * may test it, whether this reading id was seen before, the faults a verdict may change and the
     * technician's test-lead null.
     * Each separate look-up cost a statement and a row mapping on every write (profiled under
     * `npm run bench writes`); the columns are the ones the write uses, not whole rows.
     */
    writeContext: (stepId: string, userId: string, readingId: string, leadNullId: string | null) =>
      prepared(db, 'readings.writeContext', (d) =>
        d
          .select({
            step: { id: steps.id, testKind: steps.testKind, conductors: steps.conductors, removedAt: steps.removedAt },
            position: {
              id: positions.id,
              name: positions.name,
              equipmentKind: positions.equipmentKind,
              equipmentId: positions.equipmentId,
            },
            strip: { id: strips.id, label: strips.label, outOfServiceSince: strips.outOfServiceSince },
            venue: { id: venues.id, status: venues.status, profileId: venues.profileId },
            event: { orgId: events.orgId, directorId: events.directorId },
            lengthM: equipment.lengthM,
            assigned:
              sql<boolean>`exists(select 1 from venue_technicians vt where vt.venue_id = ${venues.id} and vt.user_id = ${sql.placeholder('userId')})`.mapWith(
                Boolean,
              ),
            existingHash: sql<string | null>`(select r.request_hash from readings r where r.id = ${sql.placeholder('readingId')})`,
            unclosedFaultId: sql<
              string | null
            >`(select f.id from faults f where f.step_id = ${steps.id} and f.status <> 'closed' order by f.opened_at desc limit 1)`,
            hasRepairedFault:
              sql<boolean>`exists(select 1 from faults f where f.position_id = ${positions.id} and f.status = 'repaired')`.mapWith(Boolean),
            // The test-lead null named by the reading, if it is this technician's own.
            leadNullOhm: sql<
              number | null
            >`(select ln.value_ohm from lead_nulls ln where ln.id = ${sql.placeholder('leadNullId')} and ln.taken_by = ${sql.placeholder('userId')})`,
          })
          .from(steps)
          .innerJoin(positions, eq(steps.positionId, positions.id))
          .innerJoin(strips, eq(positions.stripId, strips.id))
          .innerJoin(venues, eq(strips.venueId, venues.id))
          .innerJoin(events, eq(venues.eventId, events.id))
          .leftJoin(equipment, eq(positions.equipmentId, equipment.id))
          .where(eq(steps.id, sql.placeholder('stepId')))
          .prepare(),
      ).get({ stepId, userId, readingId, leadNullId }),

    insert: (row: NewReading) =>
      prepared(db, `readings.insert:${columnsKey(row)}`, (d) => d.insert(readings).values(placeholdersOf(row)).prepare()).run(row),
  };
}
export type ReadingWriteContext = NonNullable<ReturnType<ReturnType<typeof readingsRepository>['writeContext']>>;
