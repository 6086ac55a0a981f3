import { and, asc, desc, eq, inArray, isNull, ne, sql } from 'drizzle-orm';
import type { Db, Tx } from './client';
import { latestReadingOf } from './latest-reading';
import { events, faults, positions, steps, strips, venueTechnicians, venues, equipment } from './schema';
import { prepared } from './prepared';

export type VenueRow = typeof venues.$inferSelect;
export type EventRow = typeof events.$inferSelect;

// Venue lists in one stable order: newest event first, then the venue's name as people read it
// (case-insensitive), then the event's name and the id so that equal names never swap.
const VENUE_ORDER = [desc(events.startsOn), sql`${venues.name} collate nocase`, asc(events.name), asc(venues.id)] as const;

/** The venues a person sees listed: all of an organisation's, or those a technician is assigned to. */
const venueLists = (db: Db | Tx) => ({
  venuesOfOrg: (orgId: string) =>
    db
      .select({ venue: venues, event: events })
      .from(venues)
      .innerJoin(events, eq(venues.eventId, events.id))
      .where(eq(events.orgId, orgId))
      .orderBy(...VENUE_ORDER)
      .all(),
  venuesAssignedTo: (userId: string) =>
    db
      .select({ venue: venues, event: events })
      .from(venues)
      .innerJoin(events, eq(venues.eventId, events.id))
      .innerJoin(venueTechnicians, eq(venueTechnicians.venueId, venues.id))
      .where(eq(venueTechnicians.userId, userId))
      .orderBy(...VENUE_ORDER)
      .all(),
});

export function venuesRepository(db: Db | Tx) {
  return {
    findVenue: (id: string) =>
      prepared(db, 'venues.findVenue', (d) =>
        d
          .select({ venue: venues, event: events })
          .from(venues)
          .innerJoin(events, eq(venues.eventId, events.id))
          .where(eq(venues.id, sql.placeholder('id')))
          .prepare(),
      ).get({ id }),
    isAssigned: (venueId: string, userId: string) =>
      !!prepared(db, 'venues.isAssigned', (d) =>
        d
          .select({ userId: venueTechnicians.userId })
          .from(venueTechnicians)
          .where(and(eq(venueTechnicians.venueId, sql.placeholder('venueId')), eq(venueTechnicians.userId, sql.placeholder('userId'))))
          .prepare(),
      ).get({ venueId, userId }),
    /** The venue row alone, by id. */
    venueById: (id: string) =>
      prepared(db, 'venues.venueById', (d) =>
        d
          .select()
          .from(venues)
          .where(eq(venues.id, sql.placeholder('id')))
          .prepare(),
      ).get({ id }),
    ...venueLists(db),
    /** The venue's strips, without its pool of spares (no strip of the board, the plan or a certificate). */
    stripsOf: (venueId: string) =>
      db
        .select()
        .from(strips)
        .where(and(eq(strips.venueId, venueId), eq(strips.sparePool, false)))
        .orderBy(asc(strips.sortOrder))
        .all(),

    /** Every active step of a venue with its strip and position, and the latest reading's verdict. */
    stepsWithLatest: (venueId: string) =>
      db
        .select({
          stripId: strips.id,
          positionId: positions.id,
          stepId: steps.id,
          required: steps.required,
          verdict: sql<'pass' | 'near-limit' | 'fail' | null>`${latestReadingOf(steps.id, 'verdict')}`,
        })
        .from(steps)
        .innerJoin(positions, eq(steps.positionId, positions.id))
        .innerJoin(strips, eq(positions.stripId, strips.id))
        .where(and(eq(strips.venueId, venueId), isNull(steps.removedAt)))
        .all(),
    openFaultsOf: (venueId: string) =>
      db
        .select({ id: faults.id, stripId: faults.stripId })
        .from(faults)
        .innerJoin(strips, eq(faults.stripId, strips.id))
        .where(and(eq(strips.venueId, venueId), ne(faults.status, 'closed')))
        .all(),
    positionsOf: (stripIds: string[]) =>
      stripIds.length === 0
        ? []
        : db
            .select({ position: positions, equipment })
            .from(positions)
            .leftJoin(equipment, eq(positions.equipmentId, equipment.id))
            .where(inArray(positions.stripId, stripIds))
            .orderBy(asc(positions.sortOrder))
            .all(),
  };
}
