import { and, desc, eq } from 'drizzle-orm';
import type { Db } from './client';
import { capturedMail } from './schema';

export function mailRepository(db: Db) {
  return {
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
