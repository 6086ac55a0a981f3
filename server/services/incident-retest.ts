// What a strip needs before its incident is resolved. The incident's position (the whole strip
// when none was named) is measured again after the incident opened; a tested spare swapped in is
// checked with its position's continuity steps only (its own checklist passed in the pool); every
// other required step of the strip must still pass, as for sign-off.
import type { Db, Tx } from '../db/client';
import type { IncidentRow, SwapRow } from '../db/incidents.repository';
import { signOffRepository } from '../db/sign-off.repository';
import { faultsRepository } from '../db/faults.repository';
import { spareCovers, withSpareReadings } from './spare-readings';

type Why = 'after-incident' | 'after-swap' | 'standing';

function why(incident: IncidentRow, swap: SwapRow | undefined, row: { positionId: string; testKind: string }): Why {
  if (swap?.spareTested && row.testKind === 'continuity') return 'after-swap';
  if (swap && !swap.spareTested) return 'after-incident';
  if (swap) return 'standing';
  return incident.positionId === null || incident.positionId === row.positionId ? 'after-incident' : 'standing';
}

export function retestOf(db: Db | Tx, incident: IncidentRow, swaps: SwapRow[]) {
  const raw = signOffRepository(db).stepsWithLatestReading(incident.venueId);
  const rows = withSpareReadings(db, raw).filter((r) => r.stripId === incident.stripId && r.required);
  const latestSwap = new Map(swaps.map((s) => [s.positionId, s]));
  const steps = rows.map((r) => {
    const swap = latestSwap.get(r.positionId);
    const w = why(incident, swap, r);
    const reading = r.reading;
    // A reading on another item than the one in the position now does not count (DEVELOPERS.md).
    const onItem = !!reading && (!reading.equipmentId || !r.positionEquipmentId || reading.equipmentId === r.positionEquipmentId || spareCovers(swap, r));
    const since = w === 'after-swap' ? swap!.createdAt : incident.openedAt;
    const fresh = w === 'standing' || (!!reading && reading.takenAt >= since);
    const passes = !!reading && onItem && reading.verdict !== 'fail';
    const done = passes && fresh;
    const where = `${r.positionName}: ${r.testKind} ${r.conductors}`;
    const message = done
      ? ''
      : !reading || !onItem
        ? `${where} has no reading on the item now in the position.`
        : reading.verdict === 'fail'
          ? `${where} fails (${reading.valueText}).`
          : w === 'after-swap'
            ? `${where} is to be measured again since the swap.`
            : `${where} is to be measured again since the incident opened.`;
    return {
      stepId: r.stepId,
      positionId: r.positionId,
      positionName: r.positionName,
      assetTag: r.positionAssetTag,
      testKind: r.testKind,
      conductors: r.conductors,
      why: w,
      done,
      readingId: reading?.id ?? null,
      verdict: reading?.verdict ?? null,
      takenAt: reading?.takenAt ?? null,
      message,
    };
  });
  const openFaults = faultsRepository(db).unclosedOfStrip(incident.stripId).length;
  const missing = steps.filter((s) => !s.done);
  return { complete: missing.length === 0 && openFaults === 0 && steps.length > 0, steps, missing, openFaults };
}
export type Retest = ReturnType<typeof retestOf>;
