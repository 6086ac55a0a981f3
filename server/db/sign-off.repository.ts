import { and, asc, eq, inArray, isNull, ne, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';
import type { Db, Tx } from './client';
import { latestReadingOf } from './latest-reading';
import { equipment, faults, limitProfiles, organisations, positions, readings, signOffs, steps, strips, users, venues } from './schema';

export type SignOffRow = typeof signOffs.$inferSelect;

const readingEquipment = alias(equipment, 'reading_equipment');

/**
 * Every active step of the venue with its strip, position, current item and the latest reading
 * (latest by time taken, ties broken by insertion order: corrections supersede).
 */
export function stepsWithLatestReading(db: Db | Tx, venueId: string, stripIds?: string[]) {
  return db
    .select({
      stripId: strips.id,
      positionId: positions.id,
      positionName: positions.name,
      positionSort: positions.sortOrder,
      equipmentKind: positions.equipmentKind,
      positionEquipmentId: positions.equipmentId,
      positionAssetTag: equipment.assetTag,
      stepId: steps.id,
      testKind: steps.testKind,
      conductors: steps.conductors,
      required: steps.required,
      stepSort: steps.sortOrder,
      // What readiness, the certificates and the retest lists use: every column of a 3,400-step
      // venue's rows costs the event loop time (the request and explanation texts are left out).
      reading: {
        id: readings.id,
        stepId: readings.stepId,
        equipmentId: readings.equipmentId,
        valueText: readings.valueText,
        valueOhm: readings.valueOhm,
        overRange: readings.overRange,
        leadOffsetOhm: readings.leadOffsetOhm,
        leadNullId: readings.leadNullId,
        verdict: readings.verdict,
        limitOhm: readings.limitOhm,
        limitKind: readings.limitKind,
        source: readings.source,
        ruleId: readings.ruleId,
        profileVersion: readings.profileVersion,
        supersedesId: readings.supersedesId,
        takenBy: readings.takenBy,
        takenAt: readings.takenAt,
      },
      readingAssetTag: readingEquipment.assetTag,
      takenByName: users.name,
    })
    .from(steps)
    .innerJoin(positions, eq(steps.positionId, positions.id))
    .innerJoin(strips, eq(positions.stripId, strips.id))
    .leftJoin(equipment, eq(positions.equipmentId, equipment.id))
    .leftJoin(readings, eq(readings.id, latestReadingOf(steps.id, 'id')))
    .leftJoin(readingEquipment, eq(readings.equipmentId, readingEquipment.id))
    .leftJoin(users, eq(readings.takenBy, users.id))
    .where(and(eq(strips.venueId, venueId), isNull(steps.removedAt), stripIds ? inArray(strips.id, stripIds) : undefined))
    .orderBy(asc(strips.sortOrder), asc(positions.sortOrder), asc(steps.sortOrder))
    .all();
}

/**
 * What the venue's readiness is worked out from, as one string: each active step with its latest
 * reading, each strip with its withdrawal, each unclosed fault with its status and version, each
 * spare swapped in. Equal strings mean nothing a sign-off reads has changed (readings are never
 * edited, a correction is a new row); one SQL statement, a few milliseconds for 3,400 steps.
 */
export function recordFingerprint(db: Db | Tx, venueId: string): string {
  return db.get<{ f: string }>(sql`
    select
      coalesce((select group_concat(s.id || ':' || coalesce(${latestReadingOf(sql.raw('s.id'), 'id')}, ''), ',' order by s.id)
                from steps s join positions p on p.id = s.position_id join strips st on st.id = p.strip_id
                where st.venue_id = ${venueId} and s.removed_at is null), '')
      || '|' || coalesce((select group_concat(st.id || ':' || coalesce(st.withdrawn_at, ''), ',' order by st.id)
                from strips st where st.venue_id = ${venueId}), '')
      || '|' || coalesce((select group_concat(f.id || ':' || f.status || ':' || f.version, ',' order by f.id)
                from faults f join strips st on st.id = f.strip_id where st.venue_id = ${venueId} and f.status <> 'closed'), '')
      || '|' || coalesce((select group_concat(w.id || ':' || w.spare_tested, ',' order by w.id)
                from incident_swaps w join positions p on p.id = w.position_id join strips st on st.id = p.strip_id
                where st.venue_id = ${venueId}), '') as f`).f;
}

export function signOffRepository(db: Db | Tx) {
  return {
    stepsWithLatestReading: (venueId: string, stripIds?: string[]) => stepsWithLatestReading(db, venueId, stripIds),
    recordFingerprint: (venueId: string) => recordFingerprint(db, venueId),
    /** Every strip of the venue, the spare pool too, in plan order (what stepsWithLatestReading walks). */
    stripIdsOf: (venueId: string) =>
      db
        .select({ id: strips.id })
        .from(strips)
        .where(eq(strips.venueId, venueId))
        .orderBy(asc(strips.sortOrder))
        .all()
        .map((r) => r.id),

    openFaultsOf: (venueId: string) =>
      db
        .select({
          faultId: faults.id,
          stripId: faults.stripId,
          positionName: positions.name,
          kind: faults.kind,
          conductors: faults.conductors,
          status: faults.status,
        })
        .from(faults)
        .innerJoin(strips, eq(faults.stripId, strips.id))
        .innerJoin(positions, eq(faults.positionId, positions.id))
        .where(and(eq(strips.venueId, venueId), ne(faults.status, 'closed')))
        .all(),

    profile: (id: string) => db.select().from(limitProfiles).where(eq(limitProfiles.id, id)).get(),
    organisation: (id: string) => db.select().from(organisations).where(eq(organisations.id, id)).get(),
    user: (id: string) => db.select().from(users).where(eq(users.id, id)).get(),
    usersByIds: (ids: string[]) =>
      ids.length === 0
        ? []
        : db.select({ id: users.id, name: users.name, email: users.email }).from(users).where(inArray(users.id, ids)).all(),

    insertSignOff: (row: typeof signOffs.$inferInsert) => db.insert(signOffs).values(row).run(),
    /** The venue freezes: signed off, and its version moves on so stale plan edits are refused. */
    markVenueSignedOff: (venueId: string, fromVersion: number) =>
      db
        .update(venues)
        .set({ status: 'signed-off', version: fromVersion + 1 })
        .where(and(eq(venues.id, venueId), eq(venues.version, fromVersion)))
        .run().changes,
    activeSignOff: (venueId: string) =>
      db
        .select()
        .from(signOffs)
        .where(and(eq(signOffs.venueId, venueId), eq(signOffs.status, 'active')))
        .get(),
  };
}
export type SignOffRepository = ReturnType<typeof signOffRepository>;
