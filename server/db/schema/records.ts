// What was issued and kept: sign-offs, signing keys and certificates, attachments, the audit log,
// captured mail, the health probe and idempotent replays.
import { index, integer, sqliteTable, text } from 'drizzle-orm/sqlite-core';
import { createdAt, id, now } from './columns';
import { organisations, users } from './accounts';
import { strips, venues } from './core';

export const signOffs = sqliteTable('sign_offs', {
  id: id(),
  venueId: text('venue_id')
    .notNull()
    .references(() => venues.id),
  signedBy: text('signed_by')
    .notNull()
    .references(() => users.id),
  signedAt: text('signed_at').notNull().default(now),
  statement: text('statement').notNull(),
  exceptionsJson: text('exceptions_json').notNull().default('[]'),
  readingsDigest: text('readings_digest').notNull(),
  status: text('status', { enum: ['active', 'superseded'] })
    .notNull()
    .default('active'),
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
    signOffId: text('sign_off_id')
      .notNull()
      .references(() => signOffs.id),
    venueId: text('venue_id')
      .notNull()
      .references(() => venues.id),
    stripId: text('strip_id').references(() => strips.id),
    kind: text('kind', { enum: ['venue', 'strip'] }).notNull(),
    status: text('status', { enum: ['valid', 'superseded', 'revoked'] })
      .notNull()
      .default('valid'),
    payloadJson: text('payload_json').notNull(),
    jws: text('jws').notNull(),
    keyId: text('key_id')
      .notNull()
      .references(() => signingKeys.kid),
    pdfSha256: text('pdf_sha256'),
    pdfPath: text('pdf_path'),
    issuedAt: text('issued_at').notNull().default(now),
    supersededAt: text('superseded_at'),
    revokedAt: text('revoked_at'),
    revokedReason: text('revoked_reason'),
    revokedBy: text('revoked_by').references(() => users.id),
    // A strip certificate whose strip changed after sign-off: an amendment will supersede it.
    supersededPendingSince: text('superseded_pending_since'),
    // The strip certificate an amendment issued in its place, and the amendment that issued this one.
    successorId: text('successor_id'),
    amendmentId: text('amendment_id'),
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
    createdBy: text('created_by')
      .notNull()
      .references(() => users.id),
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
