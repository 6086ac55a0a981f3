// Issued certificates: written by the sign-off, listed, looked up by number or by file hash, revoked.
import { and, asc, desc, eq, inArray } from 'drizzle-orm';
import type { Db, Tx } from './client';
import { certificates, signOffs, strips, users, venues } from './schema';

export type CertificateRow = typeof certificates.$inferSelect;

export function certificatesRepository(db: Db | Tx) {
  return {
    insert: (row: typeof certificates.$inferInsert) => db.insert(certificates).values(row).run(),
    /** A sign-off's certificates in one statement: 121 inserts one by one held the event loop for 40–100 ms. */
    insertMany: (rows: (typeof certificates.$inferInsert)[]) => (rows.length ? db.insert(certificates).values(rows).run() : undefined),
    /** The venue's clock, for showing a certificate's times. */
    venueTimeZone: (venueId: string) => db.select({ timeZone: venues.timeZone }).from(venues).where(eq(venues.id, venueId)).get()?.timeZone,
    /** Which of these numbers are given out already, in one query. */
    numbersTaken: (numbers: string[]) =>
      new Set(
        db
          .select({ number: certificates.number })
          .from(certificates)
          .where(inArray(certificates.number, numbers))
          .all()
          .map((r) => r.number),
      ),

    ofVenue: (venueId: string) =>
      db
        .select({ certificate: certificates, signOff: signOffs, signerName: users.name, stripLabel: strips.label })
        .from(certificates)
        .innerJoin(signOffs, eq(certificates.signOffId, signOffs.id))
        .innerJoin(users, eq(signOffs.signedBy, users.id))
        .leftJoin(strips, eq(certificates.stripId, strips.id))
        .where(eq(certificates.venueId, venueId))
        .orderBy(desc(certificates.issuedAt), asc(certificates.kind), asc(strips.sortOrder))
        .all(),
    /** Every certificate of one sign-off (its venue certificate and strip certificates). */
    ofSignOff: (signOffId: string) =>
      db
        .select({ certificate: certificates, stripLabel: strips.label })
        .from(certificates)
        .leftJoin(strips, eq(certificates.stripId, strips.id))
        .where(eq(certificates.signOffId, signOffId))
        .orderBy(asc(strips.sortOrder))
        .all(),
    ofAmendment: (amendmentId: string) => db.select().from(certificates).where(eq(certificates.amendmentId, amendmentId)).all(),
    /** The strip's certificate that is valid now (at most one: an amendment supersedes the one before). */
    validStripCertificate: (stripId: string) =>
      db
        .select()
        .from(certificates)
        .where(and(eq(certificates.stripId, stripId), eq(certificates.status, 'valid')))
        .orderBy(desc(certificates.issuedAt))
        .get(),
    supersede: (id: string, v: { at: string; successorId: string }) =>
      db
        .update(certificates)
        .set({ status: 'superseded', supersededAt: v.at, successorId: v.successorId })
        .where(eq(certificates.id, id))
        .run(),
    predecessorOf: (number: string) => {
      const c = db.select({ id: certificates.id }).from(certificates).where(eq(certificates.number, number)).get();
      return c ? db.select().from(certificates).where(eq(certificates.successorId, c.id)).get() : undefined;
    },
    byId: (id: string) => db.select().from(certificates).where(eq(certificates.id, id)).get(),
    byNumber: (number: string) => db.select().from(certificates).where(eq(certificates.number, number)).get(),
    bySha: (sha256: string) => db.select().from(certificates).where(eq(certificates.pdfSha256, sha256)).all(),
    revoke: (id: string, v: { at: string; reason: string; by: string }) =>
      db
        .update(certificates)
        .set({ status: 'revoked', revokedAt: v.at, revokedReason: v.reason, revokedBy: v.by })
        .where(eq(certificates.id, id))
        .run(),
  };
}
