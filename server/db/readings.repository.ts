import { eq, sql } from 'drizzle-orm';
import type { Db, Tx } from './client';
import { readings, users } from './schema';
import { placeholdersOf, prepared } from './prepared';

export type NewReading = typeof readings.$inferInsert;

// Readings are append-only: there is no update or delete here on purpose.
export function readingsRepository(db: Db | Tx) {
  return {
    findById: (id: string) =>
      prepared(db, 'readings.findById', (d) =>
        d
          .select({ reading: readings, takenByName: users.name })
          .from(readings)
          .leftJoin(users, eq(readings.takenBy, users.id))
          .where(eq(readings.id, sql.placeholder('id')))
          .prepare(),
      ).get({ id }),
    insert: (row: NewReading) => {
      const p = placeholdersOf(row);
      return prepared(db, `readings.insert:${p.key}`, (d) => d.insert(readings).values(p.values).prepare()).run(row);
    },
  };
}
