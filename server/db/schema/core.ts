// The whole domain of the product, modelled up front so later work adds behaviour, not upheaval.
// Times are ISO-8601 strings (UTC); ids are random UUIDs unless a table says otherwise.
import { createdAt, id, now } from './columns';
import { index, integer, primaryKey, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { DEFAULT_TIME_ZONE } from '../../../shared/format/date-time';
import { organisations, users } from './accounts';

export const limitProfiles = sqliteTable(
  'limit_profiles',
  {
    id: id(),
    orgId: text('org_id')
      .notNull()
      .references(() => organisations.id),
    // All versions of one profile share a lineage; editing adds a version, never rewrites one.
    lineageId: text('lineage_id').notNull(),
    name: text('name').notNull(),
    version: integer('version').notNull(),
    rulesJson: text('rules_json').notNull(),
    loopRequiredJson: text('loop_required_json').notNull().default('[]'),
    // Copper readings taken with a temperature are corrected to this °C (a house rule); null: judged as measured.
    temperatureReferenceC: real('temperature_reference_c'),
    notes: text('notes'),
    createdBy: text('created_by').references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('limit_profiles_lineage_version').on(t.lineageId, t.version)],
);

export const events = sqliteTable('events', {
  id: id(),
  orgId: text('org_id')
    .notNull()
    .references(() => organisations.id),
  name: text('name').notNull(),
  startsOn: text('starts_on').notNull(),
  endsOn: text('ends_on').notNull(),
  directorId: text('director_id').references(() => users.id),
  organiserId: text('organiser_id').references(() => users.id),
  createdAt: createdAt(),
});

export const venues = sqliteTable(
  'venues',
  {
    id: id(),
    eventId: text('event_id')
      .notNull()
      .references(() => events.id),
    name: text('name').notNull(),
    profileId: text('profile_id')
      .notNull()
      .references(() => limitProfiles.id),
    status: text('status', { enum: ['planning', 'testing', 'signed-off'] })
      .notNull()
      .default('planning'),
    // Optimistic concurrency for plan edits (ETag / If-Match).
    version: integer('version').notNull().default(1),
    clonedFromId: text('cloned_from_id'),
    // The hall's clock (IANA name): every time of the venue is shown in it, whoever reads it.
    timeZone: text('time_zone').notNull().default(DEFAULT_TIME_ZONE),
    createdAt: createdAt(),
  },
  (t) => [index('venues_event_idx').on(t.eventId)],
);

export const venueTechnicians = sqliteTable(
  'venue_technicians',
  {
    venueId: text('venue_id')
      .notNull()
      .references(() => venues.id),
    userId: text('user_id')
      .notNull()
      .references(() => users.id),
  },
  (t) => [primaryKey({ columns: [t.venueId, t.userId] })],
);

export const strips = sqliteTable(
  'strips',
  {
    id: id(),
    venueId: text('venue_id')
      .notNull()
      .references(() => venues.id),
    label: text('label').notNull(),
    sortOrder: integer('sort_order').notNull(),
    zone: text('zone'),
    conductivePiste: integer('conductive_piste', { mode: 'boolean' }).notNull().default(false),
    withdrawnReason: text('withdrawn_reason'),
    withdrawnAt: text('withdrawn_at'),
    // Suspended after sign-off by a change on the strip (an incident, a reading, a repair, a swap)
    // until the director amends it; the venue and its other strips stay signed off.
    outOfServiceSince: text('out_of_service_since'),
    // The venue's spare pool: one strip per venue holding a position per spare, so spares are tested
    // with their kind's checklist like any position. Never on the board, the plan or a certificate.
    sparePool: integer('spare_pool', { mode: 'boolean' }).notNull().default(false),
  },
  (t) => [index('strips_venue_idx').on(t.venueId), uniqueIndex('strips_venue_label').on(t.venueId, t.label)],
);

export const equipment = sqliteTable(
  'equipment',
  {
    id: id(),
    orgId: text('org_id')
      .notNull()
      .references(() => organisations.id),
    assetTag: text('asset_tag').notNull(),
    kind: text('kind', { enum: ['floor-cable', 'reel', 'piste', 'body-wire', 'apparatus', 'other'] }).notNull(),
    description: text('description').notNull().default(''),
    lengthM: real('length_m'),
    conductorMm2: real('conductor_mm2'),
    awg: integer('awg'),
    cableType: text('cable_type'),
    velocityFactor: real('velocity_factor'),
    status: text('status', { enum: ['in-service', 'under-repair', 'retired'] })
      .notNull()
      .default('in-service'),
    notes: text('notes'),
    version: integer('version').notNull().default(1),
    createdAt: createdAt(),
    // "To inspect": taken out of a strip during this incident (no foreign key: incidents are defined later).
    toInspectIncidentId: text('to_inspect_incident_id'),
  },
  (t) => [uniqueIndex('equipment_org_tag').on(t.orgId, t.assetTag)],
);

export const velocityCalibrations = sqliteTable('velocity_calibrations', {
  id: id(),
  equipmentId: text('equipment_id')
    .notNull()
    .references(() => equipment.id),
  velocityFactor: real('velocity_factor').notNull(),
  lengthM: real('length_m').notNull(),
  roundTripNs: real('round_trip_ns').notNull(),
  createdBy: text('created_by').references(() => users.id),
  createdAt: createdAt(),
});

export const positions = sqliteTable(
  'positions',
  {
    id: id(),
    stripId: text('strip_id')
      .notNull()
      .references(() => strips.id),
    name: text('name').notNull(),
    equipmentKind: text('equipment_kind', {
      enum: ['floor-cable', 'reel', 'piste', 'body-wire', 'apparatus', 'other'],
    }).notNull(),
    equipmentId: text('equipment_id').references(() => equipment.id),
    sortOrder: integer('sort_order').notNull(),
  },
  (t) => [index('positions_strip_idx').on(t.stripId)],
);

// Which item sat in which position and when, so an item's history shows the strips it was on.
export const positionAssignments = sqliteTable('position_assignments', {
  id: id(),
  positionId: text('position_id')
    .notNull()
    .references(() => positions.id),
  equipmentId: text('equipment_id')
    .notNull()
    .references(() => equipment.id),
  assignedAt: text('assigned_at').notNull().default(now),
  removedAt: text('removed_at'),
  assignedBy: text('assigned_by').references(() => users.id),
});

export const steps = sqliteTable(
  'steps',
  {
    id: id(),
    positionId: text('position_id')
      .notNull()
      .references(() => positions.id),
    testKind: text('test_kind', {
      enum: ['continuity', 'insulation', 'loop', 'piste-end-to-end', 'piste-earth'],
    }).notNull(),
    conductors: text('conductors').notNull(),
    sortOrder: integer('sort_order').notNull(),
    required: integer('required', { mode: 'boolean' }).notNull().default(true),
    addedByDirector: integer('added_by_director', { mode: 'boolean' }).notNull().default(false),
    // A dropped step is kept (readings point at it) but no longer asked for.
    removedAt: text('removed_at'),
  },
  (t) => [index('steps_position_idx').on(t.positionId)],
);

// A technician's test-lead null: the leads' own resistance with the probe tips touching, measured
// once per session and subtracted from that technician's readings. Its own record (who, when,
// which meter), so a reading says which null it used. The id is made on the tablet, like a
// reading's, so a null set offline is recognised when it is sent again.
export const leadNulls = sqliteTable(
  'lead_nulls',
  {
    id: id(),
    orgId: text('org_id')
      .notNull()
      .references(() => organisations.id),
    takenBy: text('taken_by')
      .notNull()
      .references(() => users.id),
    // The sign-in session it was sent from (null if that session is gone from the record).
    sessionId: text('session_id'),
    valueText: text('value_text').notNull(),
    valueOhm: real('value_ohm').notNull(),
    meter: text('meter'),
    takenAt: text('taken_at').notNull(),
    receivedAt: text('received_at').notNull(),
  },
  (t) => [index('lead_nulls_taken_by_idx').on(t.takenBy)],
);

// Append-only: a correction is a new reading that supersedes an earlier one.
export const readings = sqliteTable(
  'readings',
  {
    id: id(), // made by the client, so a replay is recognised
    stepId: text('step_id')
      .notNull()
      .references(() => steps.id),
    equipmentId: text('equipment_id').references(() => equipment.id),
    valueText: text('value_text').notNull(),
    valueOhm: real('value_ohm'),
    overRange: integer('over_range', { mode: 'boolean' }).notNull(),
    // The test-lead null subtracted (its value, copied when the reading was judged) and its record.
    leadOffsetOhm: real('lead_offset_ohm'),
    leadNullId: text('lead_null_id').references(() => leadNulls.id),
    temperatureC: real('temperature_c'),
    verdict: text('verdict', { enum: ['pass', 'near-limit', 'fail'] }).notNull(),
    limitOhm: real('limit_ohm'),
    limitKind: text('limit_kind', { enum: ['max', 'min'] }),
    source: text('source').notNull(),
    ruleId: text('rule_id'),
    profileId: text('profile_id')
      .notNull()
      .references(() => limitProfiles.id),
    profileVersion: integer('profile_version').notNull(),
    explanation: text('explanation').notNull(),
    supersedesId: text('supersedes_id'),
    correctionReason: text('correction_reason'),
    // Fingerprint of the request body, to tell an idempotent replay from a different body.
    requestHash: text('request_hash').notNull(),
    takenBy: text('taken_by')
      .notNull()
      .references(() => users.id),
    takenAt: text('taken_at').notNull().default(now),
    // When the server got it (a reading typed offline arrives later than it was taken). Null on
    // rows from before this column: they were stamped on arrival, so taken_at is that time.
    receivedAt: text('received_at'),
  },
  (t) => [index('readings_step_idx').on(t.stepId, t.takenAt)],
);

export const faults = sqliteTable(
  'faults',
  {
    id: id(),
    stripId: text('strip_id')
      .notNull()
      .references(() => strips.id),
    positionId: text('position_id')
      .notNull()
      .references(() => positions.id),
    equipmentId: text('equipment_id').references(() => equipment.id),
    stepId: text('step_id').references(() => steps.id),
    readingId: text('reading_id').references(() => readings.id),
    kind: text('kind', { enum: ['short', 'open', 'high-resistance', 'intermittent'] }).notNull(),
    conductors: text('conductors').notNull(),
    status: text('status', { enum: ['open', 'located', 'repaired', 'closed'] })
      .notNull()
      .default('open'),
    notes: text('notes'),
    version: integer('version').notNull().default(1),
    openedBy: text('opened_by')
      .notNull()
      .references(() => users.id),
    openedAt: text('opened_at').notNull().default(now),
    closedAt: text('closed_at'),
    // A fault that was a typing mistake is closed by the event's director with a reason, not by a
    // correction: who, when and why are kept here (and in the audit trail and on the certificate).
    dismissedBy: text('dismissed_by').references(() => users.id),
    dismissedAt: text('dismissed_at'),
    dismissedReason: text('dismissed_reason'),
  },
  // Every reading looks up its step's unclosed fault and its position's repaired ones.
  (t) => [index('faults_strip_idx').on(t.stripId), index('faults_step_idx').on(t.stepId), index('faults_position_idx').on(t.positionId)],
);

export const faultEstimates = sqliteTable('fault_estimates', {
  id: id(),
  faultId: text('fault_id')
    .notNull()
    .references(() => faults.id),
  method: text('method').notNull(),
  fromEnd: text('from_end').notNull().default('near'),
  inputsJson: text('inputs_json').notNull(),
  distanceM: real('distance_m').notNull(),
  uncertaintyM: real('uncertainty_m').notNull(),
  resultJson: text('result_json').notNull(),
  // The item's recorded length when the estimate was made: a later cut-out does not move it.
  itemLengthM: real('item_length_m'),
  createdBy: text('created_by')
    .notNull()
    .references(() => users.id),
  createdAt: createdAt(),
});

export const repairs = sqliteTable('repairs', {
  id: id(),
  faultId: text('fault_id')
    .notNull()
    .references(() => faults.id),
  equipmentId: text('equipment_id').references(() => equipment.id),
  action: text('action', { enum: ['cut-out', 'connector-remade', 'swapped', 'retired'] }).notNull(),
  lengthRemovedM: real('length_removed_m'),
  lengthBeforeM: real('length_before_m'),
  replacementEquipmentId: text('replacement_equipment_id').references(() => equipment.id),
  notes: text('notes'),
  createdBy: text('created_by')
    .notNull()
    .references(() => users.id),
  createdAt: createdAt(),
});
