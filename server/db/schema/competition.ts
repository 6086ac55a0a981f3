// Competition days: incidents on a signed-off venue, the swaps that bring a strip back, and the
// director's amendments (new strip certificates without re-opening the venue).
import { index, integer, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { createdAt, id, now } from './columns';
import { users } from './accounts';
import { equipment, positions, strips, venues } from './core';
import { signOffs } from './records';

export const amendments = sqliteTable(
  'amendments',
  {
    id: id(),
    venueId: text('venue_id')
      .notNull()
      .references(() => venues.id),
    signOffId: text('sign_off_id')
      .notNull()
      .references(() => signOffs.id),
    amendedBy: text('amended_by')
      .notNull()
      .references(() => users.id),
    amendedAt: text('amended_at').notNull().default(now),
  },
  (t) => [index('amendments_venue_idx').on(t.venueId)],
);

export const incidents = sqliteTable(
  'incidents',
  {
    id: id(),
    venueId: text('venue_id')
      .notNull()
      .references(() => venues.id),
    stripId: text('strip_id')
      .notNull()
      .references(() => strips.id),
    positionId: text('position_id').references(() => positions.id),
    // The item in the position when the incident was opened.
    equipmentId: text('equipment_id').references(() => equipment.id),
    symptom: text('symptom').notNull(),
    status: text('status', { enum: ['open', 'resolved'] })
      .notNull()
      .default('open'),
    // Made on the tablet: an incident typed offline and sent twice is one incident.
    clientId: text('client_id'),
    openedBy: text('opened_by')
      .notNull()
      .references(() => users.id),
    openedAt: text('opened_at').notNull().default(now),
    resolvedAt: text('resolved_at'),
    resolvedBy: text('resolved_by').references(() => users.id),
    amendmentId: text('amendment_id').references(() => amendments.id),
  },
  (t) => [
    index('incidents_venue_idx').on(t.venueId),
    index('incidents_strip_idx').on(t.stripId),
    uniqueIndex('incidents_client_id').on(t.clientId),
  ],
);

export const incidentSwaps = sqliteTable(
  'incident_swaps',
  {
    id: id(),
    incidentId: text('incident_id')
      .notNull()
      .references(() => incidents.id),
    positionId: text('position_id')
      .notNull()
      .references(() => positions.id),
    removedEquipmentId: text('removed_equipment_id').references(() => equipment.id),
    replacementEquipmentId: text('replacement_equipment_id')
      .notNull()
      .references(() => equipment.id),
    // The spare's position in the pool, where its own checklist was measured.
    sparePositionId: text('spare_position_id')
      .notNull()
      .references(() => positions.id),
    spareTested: integer('spare_tested', { mode: 'boolean' }).notNull(),
    createdBy: text('created_by')
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [index('incident_swaps_incident_idx').on(t.incidentId), index('incident_swaps_position_idx').on(t.positionId)],
);
