import { and, asc, eq, isNull, ne } from 'drizzle-orm';
import type { Db, Tx } from './client';
import { signingKeys } from './schema';

export function signingKeysRepository(db: Db | Tx) {
  return {
    all: () => db.select().from(signingKeys).orderBy(asc(signingKeys.createdAt)).all(),
    find: (kid: string) => db.select().from(signingKeys).where(eq(signingKeys.kid, kid)).get(),
    /** Records the current key and retires the others; their public keys stay for verification. */
    makeCurrent(kid: string, publicJwkJson: string, at: string) {
      db.insert(signingKeys).values({ kid, publicJwkJson, createdAt: at }).onConflictDoNothing().run();
      db.update(signingKeys).set({ retiredAt: null }).where(eq(signingKeys.kid, kid)).run();
      db.update(signingKeys)
        .set({ retiredAt: at })
        .where(and(ne(signingKeys.kid, kid), isNull(signingKeys.retiredAt)))
        .run();
    },
  };
}
