// The whole domain of the product, modelled up front so later work adds behaviour, not upheaval.
// Times are ISO-8601 strings (UTC); ids are random UUIDs unless a table says otherwise.
import { sql } from 'drizzle-orm';
import { index, integer, primaryKey, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';

const now = sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))`;
const id = () => text('id').primaryKey();
const createdAt = () => text('created_at').notNull().default(now);

export const organisations = sqliteTable('organisations', {
  id: id(),
  name: text('name').notNull(),
  createdAt: createdAt(),
});

export const users = sqliteTable(
  'users',
  {
    id: id(),
    orgId: text('org_id').notNull().references(() => organisations.id),
    email: text('email').notNull(),
    name: text('name').notNull(),
    role: text('role', { enum: ['admin', 'organiser', 'director', 'technician'] }).notNull(),
    // Null until an invited person sets a password.
    passwordHash: text('password_hash'),
    disabled: integer('disabled', { mode: 'boolean' }).notNull().default(false),
    unitSystem: text('unit_system', { enum: ['metric', 'imperial'] }).notNull().default('metric'),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('users_email_unique').on(t.email)],
);

export const sessions = sqliteTable(
  'sessions',
  {
    id: id(),
    userId: text('user_id').notNull().references(() => users.id),
    createdAt: createdAt(),
    lastSeenAt: text('last_seen_at').notNull(),
    expiresAt: text('expires_at').notNull(),
    revokedAt: text('revoked_at'),
    userAgent: text('user_agent'),
  },
  (t) => [index('sessions_user_idx').on(t.userId)],
);

// One-time links: invitations and password resets. Only the SHA-256 of the token is kept.
export const userTokens = sqliteTable('user_tokens', {
  id: id(),
  userId: text('user_id').notNull().references(() => users.id),
  purpose: text('purpose', { enum: ['invite', 'reset'] }).notNull(),
  tokenHash: text('token_hash').notNull().unique(),
  expiresAt: text('expires_at').notNull(),
  usedAt: text('used_at'),
  createdAt: createdAt(),
});

export const limitProfiles = sqliteTable(
  'limit_profiles',
  {
    id: id(),
    orgId: text('org_id').notNull().references(() => organisations.id),
    // All versions of one profile share a lineage; editing adds a version, never rewrites one.
    lineageId: text('lineage_id').notNull(),
    name: text('name').notNull(),
    version: integer('version').notNull(),
    rulesJson: text('rules_json').notNull(),
    loopRequiredJson: text('loop_required_json').notNull().default('[]'),
    notes: text('notes'),
    createdBy: text('created_by').references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('limit_profiles_lineage_version').on(t.lineageId, t.version)],
);

export const events = sqliteTable('events', {
  id: id(),
  orgId: text('org_id').notNull().references(() => organisations.id),
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
    eventId: text('event_id').notNull().references(() => events.id),
    name: text('name').notNull(),
    profileId: text('profile_id').notNull().references(() => limitProfiles.id),
    status: text('status', { enum: ['planning', 'testing', 'signed-off'] }).notNull().default('planning'),
    // Optimistic concurrency for plan edits (ETag / If-Match).
    version: integer('version').notNull().default(1),
    clonedFromId: text('cloned_from_id'),
    createdAt: createdAt(),
  },
  (t) => [index('venues_event_idx').on(t.eventId)],
);

export const venueTechnicians = sqliteTable(
  'venue_technicians',
  {
    venueId: text('venue_id').notNull().references(() => venues.id),
    userId: text('user_id').notNull().references(() => users.id),
  },
  (t) => [primaryKey({ columns: [t.venueId, t.userId] })],
);

export const strips = sqliteTable(
  'strips',
  {
    id: id(),
    venueId: text('venue_id').notNull().references(() => venues.id),
    label: text('label').notNull(),
    sortOrder: integer('sort_order').notNull(),
    zone: text('zone'),
    conductivePiste: integer('conductive_piste', { mode: 'boolean' }).notNull().default(false),
    withdrawnReason: text('withdrawn_reason'),
    withdrawnAt: text('withdrawn_at'),
  },
  (t) => [index('strips_venue_idx').on(t.venueId), uniqueIndex('strips_venue_label').on(t.venueId, t.label)],
);

export const equipment = sqliteTable(
  'equipment',
  {
    id: id(),
    orgId: text('org_id').notNull().references(() => organisations.id),
    assetTag: text('asset_tag').notNull(),
    kind: text('kind', { enum: ['floor-cable', 'reel', 'piste', 'body-wire', 'apparatus', 'other'] }).notNull(),
    description: text('description').notNull().default(''),
    lengthM: real('length_m'),
    conductorMm2: real('conductor_mm2'),
    awg: integer('awg'),
    cableType: text('cable_type'),
    velocityFactor: real('velocity_factor'),
    status: text('status', { enum: ['in-service', 'under-repair', 'retired'] }).notNull().default('in-service'),
    notes: text('notes'),
    version: integer('version').notNull().default(1),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('equipment_org_tag').on(t.orgId, t.assetTag)],
);

export const velocityCalibrations = sqliteTable('velocity_calibrations', {
  id: id(),
  equipmentId: text('equipment_id').notNull().references(() => equipment.id),
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
    stripId: text('strip_id').notNull().references(() => strips.id),
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
  positionId: text('position_id').notNull().references(() => positions.id),
  equipmentId: text('equipment_id').notNull().references(() => equipment.id),
  assignedAt: text('assigned_at').notNull().default(now),
  removedAt: text('removed_at'),
  assignedBy: text('assigned_by').references(() => users.id),
});

export const steps = sqliteTable(
  'steps',
  {
    id: id(),
    positionId: text('position_id').notNull().references(() => positions.id),
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
    orgId: text('org_id').notNull().references(() => organisations.id),
    takenBy: text('taken_by').notNull().references(() => users.id),
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
    stepId: text('step_id').notNull().references(() => steps.id),
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
    profileId: text('profile_id').notNull().references(() => limitProfiles.id),
    profileVersion: integer('profile_version').notNull(),
    explanation: text('explanation').notNull(),
    supersedesId: text('supersedes_id'),
    correctionReason: text('correction_reason'),
    // Fingerprint of the request body, to tell an idempotent replay from a different body.
    requestHash: text('request_hash').notNull(),
    takenBy: text('taken_by').notNull().references(() => users.id),
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
    stripId: text('strip_id').notNull().references(() => strips.id),
    positionId: text('position_id').notNull().references(() => positions.id),
    equipmentId: text('equipment_id').references(() => equipment.id),
    stepId: text('step_id').references(() => steps.id),
    readingId: text('reading_id').references(() => readings.id),
    kind: text('kind', { enum: ['short', 'open', 'high-resistance', 'intermittent'] }).notNull(),
    conductors: text('conductors').notNull(),
    status: text('status', { enum: ['open', 'located', 'repaired', 'closed'] }).notNull().default('open'),
    notes: text('notes'),
    version: integer('version').notNull().default(1),
    openedBy: text('opened_by').notNull().references(() => users.id),
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
  faultId: text('fault_id').notNull().references(() => faults.id),
  method: text('method').notNull(),
  fromEnd: text('from_end').notNull().default('near'),
  inputsJson: text('inputs_json').notNull(),
  distanceM: real('distance_m').notNull(),
  uncertaintyM: real('uncertainty_m').notNull(),
  resultJson: text('result_json').notNull(),
  createdBy: text('created_by').notNull().references(() => users.id),
  createdAt: createdAt(),
});

export const repairs = sqliteTable('repairs', {
  id: id(),
  faultId: text('fault_id').notNull().references(() => faults.id),
  equipmentId: text('equipment_id').references(() => equipment.id),
  action: text('action', { enum: ['cut-out', 'connector-remade', 'swapped', 'retired'] }).notNull(),
  lengthRemovedM: real('length_removed_m'),
  lengthBeforeM: real('length_before_m'),
  replacementEquipmentId: text('replacement_equipment_id').references(() => equipment.id),
  notes: text('notes'),
  createdBy: text('created_by').notNull().references(() => users.id),
  createdAt: createdAt(),
});

export const signOffs = sqliteTable('sign_offs', {
  id: id(),
  venueId: text('venue_id').notNull().references(() => venues.id),
  signedBy: text('signed_by').notNull().references(() => users.id),
  signedAt: text('signed_at').notNull().default(now),
  statement: text('statement').notNull(),
  exceptionsJson: text('exceptions_json').notNull().default('[]'),
  readingsDigest: text('readings_digest').notNull(),
  status: text('status', { enum: ['active', 'superseded'] }).notNull().default('active'),
  supersededAt: text('superseded_at'),
  supersededReason: text('superseded_reason'),
});

export const signingKeys = sqliteTable('signing_keys', {
  kid: text('kid').primaryKey(),
  publicJwkJson: text('public_jwk_json').notNull(),
  createdAt: createdAt(),
  retiredAt: text('retired_at'),
});

export const certificates = sqliteTable(
  'certificates',
  {
    id: id(),
    number: text('number').notNull().unique(),
    signOffId: text('sign_off_id').notNull().references(() => signOffs.id),
    venueId: text('venue_id').notNull().references(() => venues.id),
    stripId: text('strip_id').references(() => strips.id),
    kind: text('kind', { enum: ['venue', 'strip'] }).notNull(),
    status: text('status', { enum: ['valid', 'superseded', 'revoked'] }).notNull().default('valid'),
    payloadJson: text('payload_json').notNull(),
    jws: text('jws').notNull(),
    keyId: text('key_id').notNull().references(() => signingKeys.kid),
    pdfSha256: text('pdf_sha256'),
    pdfPath: text('pdf_path'),
    issuedAt: text('issued_at').notNull().default(now),
    supersededAt: text('superseded_at'),
    revokedAt: text('revoked_at'),
    revokedReason: text('revoked_reason'),
    revokedBy: text('revoked_by').references(() => users.id),
  },
  (t) => [index('certificates_venue_idx').on(t.venueId), index('certificates_sha_idx').on(t.pdfSha256)],
);

export const attachments = sqliteTable(
  'attachments',
  {
    id: id(),
    ownerType: text('owner_type', { enum: ['fault', 'repair', 'equipment'] }).notNull(),
    ownerId: text('owner_id').notNull(),
    kind: text('kind', { enum: ['photo', 'trace', 'pdf'] }).notNull(),
    contentType: text('content_type').notNull(),
    size: integer('size').notNull(),
    sha256: text('sha256').notNull(),
    storedName: text('stored_name').notNull(),
    originalName: text('original_name').notNull(),
    previewName: text('preview_name'),
    createdBy: text('created_by').notNull().references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [index('attachments_owner_idx').on(t.ownerType, t.ownerId)],
);

export const auditLog = sqliteTable(
  'audit_log',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    orgId: text('org_id'),
    actorId: text('actor_id'),
    action: text('action').notNull(),
    entityType: text('entity_type').notNull(),
    entityId: text('entity_id').notNull(),
    detailJson: text('detail_json').notNull().default('{}'),
    at: text('at').notNull().default(now),
  },
  (t) => [index('audit_entity_idx').on(t.entityType, t.entityId)],
);

// What the local fake SMTP server received (demo, dev and tests).
// What the local fake SMTP server received. One-time links (set a password, reset, invitation) are
// never stored: text and html hold them withheld, and `raw` is then only the message's headers.
// Each message belongs to the organisation that sent it; rows without one are shown to nobody.
export const capturedMail = sqliteTable(
  'captured_mail',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    orgId: text('org_id').references(() => organisations.id),
    fromAddress: text('from_address').notNull(),
    toAddresses: text('to_addresses').notNull(),
    subject: text('subject').notNull(),
    text: text('text').notNull().default(''),
    html: text('html'),
    raw: text('raw').notNull(),
    receivedAt: text('received_at').notNull().default(now),
  },
  (t) => [index('captured_mail_org_idx').on(t.orgId, t.id)],
);

// One row, rewritten by GET /api/health: proof that a write can still commit.
export const healthProbe = sqliteTable('health_probe', {
  id: integer('id').primaryKey(),
  checkedAt: text('checked_at').notNull(),
});

// Replays of offline writes: the stored answer for an Idempotency-Key.
export const idempotencyKeys = sqliteTable('idempotency_keys', {
  key: text('key').primaryKey(),
  userId: text('user_id').notNull(),
  requestHash: text('request_hash').notNull(),
  status: integer('status').notNull(),
  responseJson: text('response_json').notNull(),
  createdAt: createdAt(),
});
