import { and, asc, desc, eq, inArray, isNotNull, ne, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';
import type { Db, Tx } from './client';
import { equipment, faultEstimates, faults, positions, repairs, strips, users } from './schema';
import { prepared } from './prepared';

export type FaultRow = typeof faults.$inferSelect;
export type FaultEstimateRow = typeof faultEstimates.$inferSelect;
export type RepairRow = typeof repairs.$inferSelect;

const dismissers = alias(users, 'dismissers');

const listColumns = {
  fault: faults,
  stripLabel: strips.label,
  venueId: strips.venueId,
  positionName: positions.name,
  equipment,
  openedByName: users.name,
  dismissedByName: dismissers.name,
};

/** Faults with what a list shows beside them: strip, position, item, who opened and dismissed them. */
const listQuery = (db: Db | Tx) =>
  db
    .select(listColumns)
    .from(faults)
    .innerJoin(strips, eq(faults.stripId, strips.id))
    .innerJoin(positions, eq(faults.positionId, positions.id))
    .leftJoin(equipment, eq(faults.equipmentId, equipment.id))
    .leftJoin(users, eq(faults.openedBy, users.id))
    .leftJoin(dismissers, eq(faults.dismissedBy, dismissers.id));

export function faultsRepository(db: Db | Tx) {
  const base = () => listQuery(db);
  return {
    findById: (id: string) => base().where(eq(faults.id, id)).get(),
    ofVenue: (venueId: string) => base().where(eq(strips.venueId, venueId)).orderBy(desc(faults.openedAt), asc(strips.sortOrder)).all(),
    unclosedOfStrip: (stripId: string) =>
      base()
        .where(and(eq(faults.stripId, stripId), ne(faults.status, 'closed')))
        .orderBy(desc(faults.openedAt))
        .all(),
    /** A fault not yet closed on this step, if any: a second failure does not open a second fault. */
    unclosedOfStep: (stepId: string) =>
      prepared(db, 'faults.unclosedOfStep', (d) =>
        d
          .select()
          .from(faults)
          .where(and(eq(faults.stepId, sql.placeholder('stepId')), ne(faults.status, 'closed')))
          .orderBy(desc(faults.openedAt))
          .prepare(),
      ).get({ stepId }),
    ofReading: (readingId: string) =>
      prepared(db, 'faults.ofReading', (d) =>
        d
          .select()
          .from(faults)
          .where(eq(faults.readingId, sql.placeholder('readingId')))
          .prepare(),
      ).get({
        readingId,
      }),
    repairedOfPosition: (positionId: string) =>
      prepared(db, 'faults.repairedOfPosition', (d) =>
        d
          .select()
          .from(faults)
          .where(and(eq(faults.positionId, sql.placeholder('positionId')), eq(faults.status, 'repaired')))
          .prepare(),
      ).all({ positionId }),
    insert: (row: typeof faults.$inferInsert) => db.insert(faults).values(row).run(),
    /** Applies a change only when the version still matches; false when someone changed it meanwhile. */
    update: (id: string, expectedVersion: number, patch: Partial<typeof faults.$inferInsert>) =>
      db
        .update(faults)
        .set({ ...patch, version: expectedVersion + 1 })
        .where(and(eq(faults.id, id), eq(faults.version, expectedVersion)))
        .run().changes === 1,

    estimatesOf: (faultIds: string[]) =>
      faultIds.length === 0
        ? []
        : db
            .select({ estimate: faultEstimates, createdByName: users.name })
            .from(faultEstimates)
            .leftJoin(users, eq(faultEstimates.createdBy, users.id))
            .where(inArray(faultEstimates.faultId, faultIds))
            .orderBy(asc(faultEstimates.createdAt))
            .all(),
    insertEstimate: (row: typeof faultEstimates.$inferInsert) => db.insert(faultEstimates).values(row).run(),

    repairsOf: (faultId: string) =>
      db
        .select({ repair: repairs, createdByName: users.name })
        .from(repairs)
        .leftJoin(users, eq(repairs.createdBy, users.id))
        .where(eq(repairs.faultId, faultId))
        .orderBy(asc(repairs.createdAt))
        .all(),
    latestRepairOf: (faultId: string) =>
      db.select().from(repairs).where(eq(repairs.faultId, faultId)).orderBy(desc(repairs.createdAt)).get(),
    insertRepair: (row: typeof repairs.$inferInsert) => db.insert(repairs).values(row).run(),

    /** The venue's faults dismissed by its director, in strip order (for the certificate). */
    dismissedOfVenue: (venueId: string) =>
      base()
        .where(and(eq(strips.venueId, venueId), isNotNull(faults.dismissedAt)))
        .orderBy(asc(strips.sortOrder), asc(positions.sortOrder), asc(faults.dismissedAt))
        .all(),

    /** Which strip of the venue (if any) has this item in one of its positions. */
    stripHoldingItem: (venueId: string, equipmentId: string) =>
      db
        .select({ stripId: strips.id, stripLabel: strips.label, positionId: positions.id })
        .from(positions)
        .innerJoin(strips, eq(positions.stripId, strips.id))
        .where(and(eq(strips.venueId, venueId), eq(positions.equipmentId, equipmentId)))
        .get(),
  };
}
export type FaultListRow = NonNullable<ReturnType<ReturnType<typeof faultsRepository>['findById']>>;
