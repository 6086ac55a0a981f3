import { asc, eq, sql } from 'drizzle-orm';
import type { Db, Tx } from './client';
import { equipment, leadNulls, limitProfiles, positions, readings, steps, strips, users } from './schema';

// Every reading of a venue, flat, for the readings table and its CSV export.
export function readingsTableRepository(db: Db | Tx) {
  return {
    ofVenue: (venueId: string) =>
      db
        .select({
          id: readings.id,
          stripId: strips.id,
          stripLabel: strips.label,
          stripSort: strips.sortOrder,
          positionId: positions.id,
          positionName: positions.name,
          positionSort: positions.sortOrder,
          equipmentKind: positions.equipmentKind,
          assetTag: equipment.assetTag,
          stepId: steps.id,
          testKind: steps.testKind,
          conductors: steps.conductors,
          stepSort: steps.sortOrder,
          stepRemovedAt: steps.removedAt,
          valueText: readings.valueText,
          valueOhm: readings.valueOhm,
          overRange: readings.overRange,
          leadOffsetOhm: readings.leadOffsetOhm,
          leadNullId: readings.leadNullId,
          leadNullMeter: leadNulls.meter,
          verdict: readings.verdict,
          limitOhm: readings.limitOhm,
          limitKind: readings.limitKind,
          source: readings.source,
          ruleId: readings.ruleId,
          explanation: readings.explanation,
          profileId: readings.profileId,
          profileName: limitProfiles.name,
          profileVersion: readings.profileVersion,
          takenBy: readings.takenBy,
          takenByName: users.name,
          takenAt: readings.takenAt,
          receivedAt: readings.receivedAt,
          supersedesId: readings.supersedesId,
          correctionReason: readings.correctionReason,
          supersededBy: sql<
            string | null
          >`(select r2.id from readings r2 where r2.supersedes_id = ${readings.id} order by r2.taken_at desc, r2.rowid desc limit 1)`,
        })
        .from(readings)
        .innerJoin(steps, eq(readings.stepId, steps.id))
        .innerJoin(positions, eq(steps.positionId, positions.id))
        .innerJoin(strips, eq(positions.stripId, strips.id))
        .leftJoin(equipment, eq(readings.equipmentId, equipment.id))
        .leftJoin(limitProfiles, eq(readings.profileId, limitProfiles.id))
        .leftJoin(leadNulls, eq(readings.leadNullId, leadNulls.id))
        .leftJoin(users, eq(readings.takenBy, users.id))
        .where(eq(strips.venueId, venueId))
        .orderBy(asc(strips.sortOrder), asc(positions.sortOrder), asc(steps.sortOrder), asc(readings.takenAt), sql`${readings}.rowid`)
        .all(),
  };
}
