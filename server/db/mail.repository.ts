import { and, asc, desc, eq } from 'drizzle-orm';
import type { Db } from './client';
import { capturedMail, organisations, users } from './schema';

export function mailRepository(db: Db) {
  return {
    /** What every message names: the organisation it is sent for. */
    organisationName: (orgId: string) =>
      db.select({ name: organisations.name }).from(organisations).where(eq(organisations.id, orgId)).get()?.name ?? '',
    /** Whom a reset message names to ask: the organisation's longest-serving enabled admin. */
    firstAdmin: (orgId: string) =>
      db
        .select({ name: users.name, email: users.email })
        .from(users)
        .where(and(eq(users.orgId, orgId), eq(users.role, 'admin'), eq(users.disabled, false)))
        .orderBy(asc(users.createdAt), asc(users.id))
        .get(),
    list: (orgId: string, limit = 200) =>
      db
        .select({
          id: capturedMail.id,
          fromAddress: capturedMail.fromAddress,
          toAddresses: capturedMail.toAddresses,
          subject: capturedMail.subject,
          receivedAt: capturedMail.receivedAt,
        })
        .from(capturedMail)
        .where(eq(capturedMail.orgId, orgId))
        .orderBy(desc(capturedMail.id))
        .limit(limit)
        .all(),
    get: (orgId: string, id: number) =>
      db
        .select()
        .from(capturedMail)
        .where(and(eq(capturedMail.id, id), eq(capturedMail.orgId, orgId)))
        .get(),
  };
}
