// What a change after sign-off does. A change to the venue plan re-opens the venue: its sign-off
// and certificates are superseded and a new sign-off issues new ones. A change on one strip (a
// reading, a repair, a swap, an incident, a fault opened or dismissed) suspends that strip only:
// it is out of service, its strip certificate superseded-pending, until the director amends it;
// the venue certificate stays valid for the other strips.
import { and, eq, isNull } from 'drizzle-orm';
import type { Db, Tx } from '../db/client';
import { certificates, signOffs, strips, venues } from '../db/schema';
import { recordAudit } from '../db/audit.repository';
import { venuesRepository } from '../db/venues.repository';

export function reopenIfSignedOff(tx: Db | Tx, v: { venueId: string; orgId: string; actorId: string; reason: string }): boolean {
  const venue = venuesRepository(tx).venueById(v.venueId);
  if (!venue || venue.status !== 'signed-off') return false;
  const at = new Date().toISOString();
  tx.update(venues)
    .set({ status: 'testing', version: venue.version + 1 })
    .where(eq(venues.id, v.venueId))
    .run();
  tx.update(signOffs)
    .set({ status: 'superseded', supersededAt: at, supersededReason: v.reason })
    .where(and(eq(signOffs.venueId, v.venueId), eq(signOffs.status, 'active')))
    .run();
  tx.update(certificates)
    .set({ status: 'superseded', supersededAt: at })
    .where(and(eq(certificates.venueId, v.venueId), eq(certificates.status, 'valid')))
    .run();
  // A new sign-off covers every strip again: no strip stays suspended from the old one.
  tx.update(strips).set({ outOfServiceSince: null }).where(eq(strips.venueId, v.venueId)).run();
  recordAudit(tx, { orgId: v.orgId, id: v.actorId }, 'venue.reopened', 'venue', v.venueId, { reason: v.reason });
  return true;
}

/**
 * Puts one strip of a signed-off venue out of service (once: a strip already out stays out from
 * its first change). The pool of spares is no strip of the certificate and is never suspended.
 * Answers whether the strip is out of service because of this change.
 */
export function suspendStripIfSignedOff(
  tx: Db | Tx,
  v: { venueId: string; stripId: string; orgId: string; actorId: string; reason: string },
): boolean {
  const venue = venuesRepository(tx).venueById(v.venueId);
  if (!venue || venue.status !== 'signed-off') return false;
  const strip = tx.select().from(strips).where(eq(strips.id, v.stripId)).get();
  if (!strip || strip.sparePool) return false;
  if (strip.outOfServiceSince) return true;
  const at = new Date().toISOString();
  tx.update(strips).set({ outOfServiceSince: at }).where(eq(strips.id, v.stripId)).run();
  tx.update(certificates)
    .set({ supersededPendingSince: at })
    .where(and(eq(certificates.stripId, v.stripId), eq(certificates.status, 'valid'), isNull(certificates.supersededPendingSince)))
    .run();
  recordAudit(tx, { orgId: v.orgId, id: v.actorId }, 'strip.suspended', 'strip', v.stripId, { reason: v.reason, venueId: v.venueId });
  return true;
}
