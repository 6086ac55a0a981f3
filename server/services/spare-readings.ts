// A spare whose own checklist passed in the venue's pool counts as tested in the position it was
// swapped into: its pool readings stand for the position's steps, except continuity, which checks
// the new connection and is measured again in the position (the retest list says so).
import type { Db, Tx } from '../db/client';
import { incidentsRepository, type SwapRow } from '../db/incidents.repository';

interface StepRowLike {
  positionId: string;
  positionEquipmentId: string | null;
  testKind: string;
  conductors: string;
  reading: { equipmentId: string | null } | null;
  readingAssetTag: string | null;
  takenByName: string | null;
}

/** Steps whose pool reading stands in: not continuity, and not measured on the spare in the position itself. */
export const spareCovers = (swap: SwapRow | undefined, row: StepRowLike) =>
  !!swap &&
  swap.spareTested &&
  row.positionEquipmentId === swap.replacementEquipmentId &&
  row.testKind !== 'continuity' &&
  row.reading?.equipmentId !== swap.replacementEquipmentId;

/** The step rows of a venue with a swapped-in tested spare's pool readings in place of the removed item's. */
export function withSpareReadings<R extends StepRowLike>(db: Db | Tx, rows: R[]): R[] {
  const swaps = incidentsRepository(db).latestSwapsInto([...new Set(rows.map((r) => r.positionId))]);
  if (swaps.size === 0) return rows;
  const poolRow = (swap: SwapRow, r: R) =>
    rows.find(
      (p) =>
        p.positionId === swap.sparePositionId &&
        p.testKind === r.testKind &&
        p.conductors === r.conductors &&
        p.reading?.equipmentId === swap.replacementEquipmentId,
    );
  return rows.map((r) => {
    const swap = swaps.get(r.positionId);
    if (!swap || !spareCovers(swap, r)) return r;
    const stand = poolRow(swap, r);
    // The reading (its item, who took it) is the pool's; the step and position stay this one's.
    return stand ? { ...r, reading: stand.reading, readingAssetTag: stand.readingAssetTag, takenByName: stand.takenByName } : r;
  });
}
