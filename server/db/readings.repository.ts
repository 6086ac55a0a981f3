import { eq } from 'drizzle-orm';
import type { Db, Tx } from './client';
import { readings, users } from './schema';

export type NewReading = typeof readings.$inferInsert;

// Readings are append-only: there is no update or delete here on purpose.
export function readingsRepository(db: Db | Tx) {
  return {
    findById: (id: string) =>
      db
        .select({ reading: readings, takenByName: users.name })
        .from(readings)
        .leftJoin(users, eq(readings.takenBy, users.id))
        .where(eq(readings.id, id))
        .get(),
    insert: (row: NewReading) => db.insert(readings).values(row).run(),
  };
}
