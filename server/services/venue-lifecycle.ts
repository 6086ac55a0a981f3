// A signed-off venue that changes (a reading, a repair, a swap, a plan edit) is re-opened: its
// sign-off and certificates are marked superseded, and a new sign-off issues new ones.
import { and, eq } from 'drizzle-orm';
import type { Db, Tx } from '../db/client';
import { certificates, signOffs, venues } from '../db/schema';
import { recordAudit } from '../db/audit.repository';
import { venuesRepository } from '../db/venues.repository';

export function reopenIfSignedOff(
  tx: Db | Tx,
  v: { venueId: string; orgId: string; actorId: string; reason: string },
): boolean {
  const venue = venuesRepository(tx).venueById(v.venueId);
  if (!venue || venue.status !== 'signed-off') return false;
  const at = new Date().toISOString();
  tx.update(venues).set({ status: 'testing', version: venue.version + 1 }).where(eq(venues.id, v.venueId)).run();
  tx.update(signOffs)
    .set({ status: 'superseded', supersededAt: at, supersededReason: v.reason })
    .where(and(eq(signOffs.venueId, v.venueId), eq(signOffs.status, 'active')))
    .run();
  tx.update(certificates)
    .set({ status: 'superseded', supersededAt: at })
    .where(and(eq(certificates.venueId, v.venueId), eq(certificates.status, 'valid')))
    .run();
  recordAudit(tx, { orgId: v.orgId, id: v.actorId }, 'venue.reopened', 'venue', v.venueId, { reason: v.reason });
  return true;
}
