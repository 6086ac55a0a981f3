import { and, asc, desc, eq } from 'drizzle-orm';
import type { Db, Tx } from './client';
import { limitProfiles, users, venues, events } from './schema';

export type ProfileRow = typeof limitProfiles.$inferSelect;

// Limit profiles: every version is its own row; a lineage groups the versions of one profile.
export function profilesRepository(db: Db | Tx) {
  return {
    findById: (id: string) => db.select().from(limitProfiles).where(eq(limitProfiles.id, id)).get(),
    ofOrg: (orgId: string) =>
      db
        .select()
        .from(limitProfiles)
        .where(eq(limitProfiles.orgId, orgId))
        .orderBy(asc(limitProfiles.name), desc(limitProfiles.version))
        .all(),
    versionsOf: (lineageId: string) =>
      db
        .select({ profile: limitProfiles, byName: users.name })
        .from(limitProfiles)
        .leftJoin(users, eq(limitProfiles.createdBy, users.id))
        .where(eq(limitProfiles.lineageId, lineageId))
        .orderBy(desc(limitProfiles.version))
        .all(),
    latestOf: (lineageId: string) =>
      db.select().from(limitProfiles).where(eq(limitProfiles.lineageId, lineageId)).orderBy(desc(limitProfiles.version)).limit(1).get(),
    insert: (row: typeof limitProfiles.$inferInsert) => db.insert(limitProfiles).values(row).run(),
    /** Venues (of this organisation) that use one of the lineage's versions. */
    venuesUsing: (orgId: string, lineageId: string) =>
      db
        .select({
          venueId: venues.id,
          venueName: venues.name,
          eventName: events.name,
          profileId: limitProfiles.id,
          version: limitProfiles.version,
        })
        .from(venues)
        .innerJoin(events, eq(venues.eventId, events.id))
        .innerJoin(limitProfiles, eq(venues.profileId, limitProfiles.id))
        .where(and(eq(events.orgId, orgId), eq(limitProfiles.lineageId, lineageId)))
        .orderBy(asc(venues.name))
        .all(),
  };
}
