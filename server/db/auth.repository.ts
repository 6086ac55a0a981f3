import { and, eq, isNull, sql } from 'drizzle-orm';
import type { Db } from './client';
import { sessions, userTokens, users } from './schema';
import { prepared } from './prepared';

export type UserRow = typeof users.$inferSelect;

export function authRepository(db: Db) {
  return {
    findUserByEmail: (email: string) => db.select().from(users).where(eq(users.email, email)).get(),
    findUserById: (id: string) =>
      prepared(db, 'auth.userById', (d) =>
        d
          .select()
          .from(users)
          .where(eq(users.id, sql.placeholder('id')))
          .prepare(),
      ).get({ id }),
    listUsers: (orgId: string) => db.select().from(users).where(eq(users.orgId, orgId)).orderBy(users.name).all(),
    insertUser: (row: typeof users.$inferInsert) => db.insert(users).values(row).run(),
    updateUser: (id: string, patch: Partial<typeof users.$inferInsert>) => db.update(users).set(patch).where(eq(users.id, id)).run(),

    insertSession: (row: typeof sessions.$inferInsert) => db.insert(sessions).values(row).run(),
    /** A session and its user in one query: what every signed-in request looks up. */
    findSessionWithUser: (id: string) =>
      prepared(db, 'auth.sessionWithUser', (d) =>
        d
          // Every signed-in request runs this: only the columns the check and req.user need.
          .select({
            session: {
              id: sessions.id,
              userId: sessions.userId,
              expiresAt: sessions.expiresAt,
              lastSeenAt: sessions.lastSeenAt,
              revokedAt: sessions.revokedAt,
            },
            user: {
              id: users.id,
              orgId: users.orgId,
              email: users.email,
              name: users.name,
              role: users.role,
              unitSystem: users.unitSystem,
              disabled: users.disabled,
            },
          })
          .from(sessions)
          .innerJoin(users, eq(sessions.userId, users.id))
          .where(eq(sessions.id, sql.placeholder('id')))
          .prepare(),
      ).get({ id }),
    touchSession: (id: string, at: string) => db.update(sessions).set({ lastSeenAt: at }).where(eq(sessions.id, id)).run(),
    revokeSession: (id: string, at: string) =>
      db
        .update(sessions)
        .set({ revokedAt: at })
        .where(and(eq(sessions.id, id), isNull(sessions.revokedAt)))
        .run(),
    revokeUserSessions: (userId: string, at: string) =>
      db
        .update(sessions)
        .set({ revokedAt: at })
        .where(and(eq(sessions.userId, userId), isNull(sessions.revokedAt)))
        .run(),

    insertToken: (row: typeof userTokens.$inferInsert) => db.insert(userTokens).values(row).run(),
    findTokenByHash: (hash: string) => db.select().from(userTokens).where(eq(userTokens.tokenHash, hash)).get(),
    markTokenUsed: (id: string, at: string) =>
      db
        .update(userTokens)
        .set({ usedAt: at })
        .where(and(eq(userTokens.id, id), isNull(userTokens.usedAt)))
        .run(),
    revokeOpenTokens: (userId: string, at: string) =>
      db
        .update(userTokens)
        .set({ usedAt: at })
        .where(and(eq(userTokens.userId, userId), isNull(userTokens.usedAt)))
        .run(),
  };
}
export type AuthRepository = ReturnType<typeof authRepository>;
