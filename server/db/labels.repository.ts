import { and, asc, eq } from 'drizzle-orm';
import type { Db, Tx } from './client';
import { equipment, events, positions, strips, venues } from './schema';

// What a label sheet prints, and where a scanned tag leads.
export function labelsRepository(db: Db | Tx) {
  return {
    /** A venue's strips in plan order, each with its positions' items (left join: empty positions too). */
    stripsWithItems(venueId: string) {
      return db
        .select({
          stripId: strips.id,
          stripLabel: strips.label,
          zone: strips.zone,
          position: positions.name,
          equipmentId: equipment.id,
          assetTag: equipment.assetTag,
          kind: equipment.kind,
          description: equipment.description,
        })
        .from(strips)
        .leftJoin(positions, eq(positions.stripId, strips.id))
        .leftJoin(equipment, eq(equipment.id, positions.equipmentId))
        .where(eq(strips.venueId, venueId))
        .orderBy(asc(strips.sortOrder), asc(strips.label), asc(positions.sortOrder), asc(positions.name))
        .all();
    },
    /** The positions now holding an item, with their strip, venue and event (for the access check). */
    placementsOf(equipmentId: string) {
      return db
        .select({
          stripId: strips.id,
          stripLabel: strips.label,
          position: positions.name,
          venue: { id: venues.id, name: venues.name },
          event: { name: events.name, orgId: events.orgId, directorId: events.directorId, startsOn: events.startsOn },
        })
        .from(positions)
        .innerJoin(strips, eq(strips.id, positions.stripId))
        .innerJoin(venues, eq(venues.id, strips.venueId))
        .innerJoin(events, eq(events.id, venues.eventId))
        .where(and(eq(positions.equipmentId, equipmentId)))
        .all();
    },
  };
}
