import { eq, inArray } from 'drizzle-orm';
import type { Db, Tx } from './client';
import { leadNulls, users } from './schema';

export type LeadNullRow = typeof leadNulls.$inferSelect;

// Test-lead nulls are records of a measurement: inserted, never changed.
export function leadNullsRepository(db: Db | Tx) {
  return {
    findById: (id: string) =>
      db
        .select({ leadNull: leadNulls, takenByName: users.name })
        .from(leadNulls)
        .leftJoin(users, eq(leadNulls.takenBy, users.id))
        .where(eq(leadNulls.id, id))
        .get(),
    byIds: (ids: string[]) =>
      ids.length === 0
        ? []
        : db
            .select({ leadNull: leadNulls, takenByName: users.name })
            .from(leadNulls)
            .leftJoin(users, eq(leadNulls.takenBy, users.id))
            .where(inArray(leadNulls.id, ids))
            .all(),
    insert: (row: typeof leadNulls.$inferInsert) => db.insert(leadNulls).values(row).run(),
  };
}
