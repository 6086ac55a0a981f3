// Incidents, their swaps, amendments and the venue's pool of spares.
import { and, asc, desc, eq, inArray, isNotNull, or } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';
import type { Db, Tx } from './client';
import { amendments, certificates, equipment, events, incidents, incidentSwaps, positions, strips, users, venues } from './schema';

export type IncidentRow = typeof incidents.$inferSelect;
export type SwapRow = typeof incidentSwaps.$inferSelect;

const removed = alias(equipment, 'removed_equipment');
const replacement = alias(equipment, 'replacement_equipment');
const resolver = alias(users, 'resolver');

export function incidentsRepository(db: Db | Tx) {
  const base = () =>
    db
      .select({
        incident: incidents,
        stripLabel: strips.label,
        positionName: positions.name,
        equipment,
        openedByName: users.name,
        amendedAt: amendments.amendedAt,
      })
      .from(incidents)
      .innerJoin(strips, eq(incidents.stripId, strips.id))
      .leftJoin(positions, eq(incidents.positionId, positions.id))
      .leftJoin(equipment, eq(incidents.equipmentId, equipment.id))
      .leftJoin(users, eq(incidents.openedBy, users.id))
      .leftJoin(amendments, eq(incidents.amendmentId, amendments.id));
  return {
    insert: (row: typeof incidents.$inferInsert) => db.insert(incidents).values(row).run(),
    byId: (id: string) => base().where(eq(incidents.id, id)).get(),
    byClientId: (clientId: string) => db.select().from(incidents).where(eq(incidents.clientId, clientId)).get(),
    ofVenue: (venueId: string) => base().where(eq(incidents.venueId, venueId)).orderBy(desc(incidents.openedAt)).all(),
    ofIds: (ids: string[]) => (ids.length === 0 ? [] : base().where(inArray(incidents.id, ids)).all()),
    ofEquipment: (equipmentIds: string[]) =>
      equipmentIds.length === 0 ? [] : base().where(inArray(incidents.equipmentId, equipmentIds)).orderBy(desc(incidents.openedAt)).all(),
    openOfStrip: (stripId: string) =>
      db.select().from(incidents).where(and(eq(incidents.stripId, stripId), eq(incidents.status, 'open'))).all(),
    update: (id: string, patch: Partial<typeof incidents.$inferInsert>) => db.update(incidents).set(patch).where(eq(incidents.id, id)).run(),

    insertSwap: (row: typeof incidentSwaps.$inferInsert) => db.insert(incidentSwaps).values(row).run(),
    swapsOf: (incidentIds: string[]) =>
      incidentIds.length === 0
        ? []
        : db
            .select({ swap: incidentSwaps, positionName: positions.name, removed, replacement, byName: resolver.name })
            .from(incidentSwaps)
            .innerJoin(positions, eq(incidentSwaps.positionId, positions.id))
            .leftJoin(removed, eq(incidentSwaps.removedEquipmentId, removed.id))
            .innerJoin(replacement, eq(incidentSwaps.replacementEquipmentId, replacement.id))
            .leftJoin(resolver, eq(incidentSwaps.createdBy, resolver.id))
            .where(inArray(incidentSwaps.incidentId, incidentIds))
            .orderBy(asc(incidentSwaps.createdAt))
            .all(),
    /** The latest swap into each of these positions (a later swap replaces an earlier one). */
    latestSwapsInto: (positionIds: string[]) => {
      if (positionIds.length === 0) return new Map<string, SwapRow>();
      const rows = db.select().from(incidentSwaps).where(inArray(incidentSwaps.positionId, positionIds)).orderBy(asc(incidentSwaps.createdAt)).all();
      return new Map(rows.map((r) => [r.positionId, r]));
    },
    swapsOfVenueSpares: (sparePositionIds: string[]) =>
      sparePositionIds.length === 0 ? [] : db.select().from(incidentSwaps).where(inArray(incidentSwaps.sparePositionId, sparePositionIds)).all(),

    insertAmendment: (row: typeof amendments.$inferInsert) => db.insert(amendments).values(row).run(),
    /** The strip certificates amendments issued under one sign-off, oldest first. */
    amendedCertificates: (signOffId: string) =>
      db
        .select({ number: certificates.number, stripId: strips.id, strip: strips.label, at: amendments.amendedAt })
        .from(certificates)
        .innerJoin(amendments, eq(certificates.amendmentId, amendments.id))
        .innerJoin(strips, eq(certificates.stripId, strips.id))
        .where(and(eq(certificates.signOffId, signOffId), isNotNull(certificates.amendmentId)))
        .orderBy(asc(amendments.amendedAt), asc(strips.sortOrder))
        .all(),

    poolStrip: (venueId: string) => db.select().from(strips).where(and(eq(strips.venueId, venueId), eq(strips.sparePool, true))).get(),
    /** The venue's strips out of service now. */
    outOfService: (venueId: string) =>
      db
        .select({ stripId: strips.id, strip: strips.label, since: strips.outOfServiceSince })
        .from(strips)
        .where(and(eq(strips.venueId, venueId), isNotNull(strips.outOfServiceSince)))
        .orderBy(asc(strips.sortOrder))
        .all(),
  };
}
export type IncidentsRepository = ReturnType<typeof incidentsRepository>;
export type IncidentListRow = NonNullable<ReturnType<IncidentsRepository['byId']>>;

/** Incidents an item was part of, across events: in the position when opened, swapped out or put in. */
export function itemIncidentsRepository(db: Db | Tx) {
  return {
    swapsTouching: (equipmentId: string) =>
      db
        .select()
        .from(incidentSwaps)
        .where(or(eq(incidentSwaps.removedEquipmentId, equipmentId), eq(incidentSwaps.replacementEquipmentId, equipmentId)))
        .all(),
    venueNames: (venueIds: string[]) =>
      venueIds.length === 0
        ? []
        : db
            .select({ id: venues.id, name: venues.name, eventName: events.name })
            .from(venues)
            .innerJoin(events, eq(venues.eventId, events.id))
            .where(inArray(venues.id, venueIds))
            .all(),
  };
}
