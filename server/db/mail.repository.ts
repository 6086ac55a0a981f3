import { desc, eq } from 'drizzle-orm';
import type { Db } from './client';
import { capturedMail } from './schema';

export function mailRepository(db: Db) {
  return {
    list: (limit = 200) =>
      db
        .select({
          id: capturedMail.id,
          fromAddress: capturedMail.fromAddress,
          toAddresses: capturedMail.toAddresses,
          subject: capturedMail.subject,
          receivedAt: capturedMail.receivedAt,
        })
        .from(capturedMail)
        .orderBy(desc(capturedMail.id))
        .limit(limit)
        .all(),
    get: (id: number) => db.select().from(capturedMail).where(eq(capturedMail.id, id)).get(),
  };
}
