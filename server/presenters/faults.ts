// Faults as lists and pages show them: the item, the saved estimates (worded in the reader's units
// where the engine still agrees), their combination, and the one estimate a list shows.
import type { Db, Tx } from '../db/client';
import { faultsRepository, type FaultEstimateRow, type FaultListRow } from '../db/faults.repository';
import type { stripsRepository } from '../db/strips.repository';
import type { EquipmentRow } from '../db/equipment.repository';
import { FaultLocationError, ohmPerMetreFromConductorSize, runFaultLocation } from '../../shared/domain/fault-location';
import { combineSavedEstimates } from '../../shared/domain/fault-estimates';
import { faultLocationRequestSchema } from '../../shared/schemas/fault-location';
import type { LengthSystem } from '../../shared/domain/units';

export function presentEquipment(e: EquipmentRow | null) {
  if (!e) return null;
  return {
    id: e.id,
    assetTag: e.assetTag,
    kind: e.kind,
    description: e.description,
    lengthM: e.lengthM,
    velocityFactor: e.velocityFactor,
    conductorMm2: e.conductorMm2,
    status: e.status,
  };
}

/**
 * The saved estimate's explanation in the reader's units. The stored text stays as it was saved;
 * it is worded again from the saved inputs only when the engine still gives exactly the saved
 * figures from them (otherwise the saved words are the record, and are shown as they are).
 */
function explanationFor(row: FaultEstimateRow, saved: string, units: LengthSystem): string {
  const request = faultLocationRequestSchema.safeParse({ ...(JSON.parse(row.inputsJson) as object), method: row.method });
  if (!request.success || request.data.method === 'vf-calibration') return saved;
  try {
    const again = runFaultLocation(request.data, units);
    const same = Math.abs(again.distanceM - row.distanceM) <= 1e-9 && Math.abs(again.uncertaintyM - row.uncertaintyM) <= 1e-9;
    return same ? again.explanation : saved;
  } catch (err) {
    if (err instanceof FaultLocationError) return saved;
    throw err;
  }
}

// `units` undefined keeps the saved words: lists (the board every few seconds) do not show them.
// Lengths are those of the item when the estimate was made (a later cut-out does not move it);
// `lengthNowM` only says whether the item has been shortened since.
export function presentEstimate(
  row: FaultEstimateRow,
  lengthNowM: number | null,
  createdByName: string | null | undefined,
  units?: LengthSystem,
) {
  const result = JSON.parse(row.resultJson) as { explanation?: string; fromOtherEndM?: number; faultOhm?: number; velocityFactor?: number };
  const itemLengthM = row.itemLengthM;
  return {
    id: row.id,
    method: row.method,
    fromEnd: row.fromEnd as 'near' | 'far',
    distanceM: row.distanceM,
    fromOtherEndM: result.fromOtherEndM ?? (itemLengthM !== null ? itemLengthM - row.distanceM : null),
    uncertaintyM: row.uncertaintyM,
    /** From the near (apparatus) end, whichever end it was measured from, when the length is known. */
    distanceFromNearM: row.fromEnd === 'far' ? (itemLengthM !== null ? itemLengthM - row.distanceM : null) : row.distanceM,
    faultOhm: result.faultOhm ?? null,
    explanation: units ? explanationFor(row, result.explanation ?? '', units) : (result.explanation ?? ''),
    inputs: JSON.parse(row.inputsJson) as Record<string, number>,
    /** The item's recorded length when this estimate was made. */
    itemLengthM,
    itemShortenedSince: itemLengthM !== null && lengthNowM !== null && lengthNowM < itemLengthM,
    createdAt: row.createdAt,
    createdBy: row.createdBy,
    createdByName: createdByName ?? null,
  };
}
type EstimateDto = ReturnType<typeof presentEstimate>;

/**
 * The estimates of a fault weighed together where their readings are independent, brought to
 * the near end, with the disagreement flag and the ones kept apart and why. Worked out on each
 * read, so its words are in the reader's units.
 */
export function combine(estimates: EstimateDto[], units: LengthSystem = 'metric') {
  const { combined, used, apart, itemLengthM } = combineSavedEstimates(estimates, units);
  if (!combined) return null;
  return {
    ...combined,
    count: used.length,
    fromEnd: 'near' as const,
    itemLengthM,
    estimateIds: used.map((i) => estimates[i]!.id),
    apart: apart.map((a) => ({ estimateId: estimates[a.index]!.id, kind: a.kind, reason: a.reason })),
  };
}

/** The one estimate shown in lists: the combination when there are several, else the latest. */
function summaryEstimate(estimates: EstimateDto[]) {
  if (estimates.length === 0) return null;
  const combined = estimates.length > 1 ? combine(estimates) : null;
  if (combined) {
    return {
      method: 'combined',
      distanceM: combined.distanceM,
      uncertaintyM: combined.uncertaintyM,
      fromEnd: 'near' as const,
      count: combined.count,
      agree: combined.agree,
    };
  }
  const last = estimates[estimates.length - 1]!;
  return {
    method: last.method,
    distanceM: last.distanceFromNearM ?? last.distanceM,
    uncertaintyM: last.uncertaintyM,
    fromEnd: last.distanceFromNearM !== null ? ('near' as const) : last.fromEnd,
    count: 1,
    agree: true,
  };
}

export function presentFaultList(db: Db | Tx, rows: FaultListRow[], units?: LengthSystem) {
  const estimates = faultsRepository(db).estimatesOf(rows.map((r) => r.fault.id));
  const byFault = new Map<string, EstimateDto[]>();
  for (const e of estimates) {
    const row = rows.find((r) => r.fault.id === e.estimate.faultId);
    const list = byFault.get(e.estimate.faultId) ?? [];
    list.push(presentEstimate(e.estimate, row?.equipment?.lengthM ?? null, e.createdByName, units));
    byFault.set(e.estimate.faultId, list);
  }
  return rows.map((r) => ({
    id: r.fault.id,
    venueId: r.venueId,
    stripId: r.fault.stripId,
    stripLabel: r.stripLabel,
    positionId: r.fault.positionId,
    positionName: r.positionName,
    stepId: r.fault.stepId,
    readingId: r.fault.readingId,
    equipment: presentEquipment(r.equipment),
    kind: r.fault.kind,
    conductors: r.fault.conductors,
    status: r.fault.status,
    notes: r.fault.notes,
    version: r.fault.version,
    estimate: summaryEstimate(byFault.get(r.fault.id) ?? []),
    openedAt: r.fault.openedAt,
    openedBy: r.fault.openedBy,
    openedByName: r.openedByName,
    closedAt: r.fault.closedAt,
    // Closed by the director as a typing mistake (null when it closed by a retest, or is open).
    dismissal: r.fault.dismissedAt
      ? { at: r.fault.dismissedAt, by: r.fault.dismissedBy, byName: r.dismissedByName, reason: r.fault.dismissedReason ?? '' }
      : null,
  }));
}

/**
 * What the locating forms can start from: the length, and Ω per metre from the cable's own
 * continuity reading of a sound conductor (one not involved in the fault), else from its size.
 */
export function prefillFor(
  row: FaultListRow,
  steps: ReturnType<ReturnType<typeof stripsRepository>['activeStepsOf']>,
  readings: ReturnType<ReturnType<typeof stripsRepository>['readingsOfSteps']>,
) {
  const lengthM = row.equipment?.lengthM ?? null;
  const involved = new Set(row.fault.conductors.split('-'));
  const out: {
    lengthM: number | null;
    velocityFactor: number | null;
    soundConductor: string | null;
    conductorOhm: number | null;
    ohmPerMetre: number | null;
    ohmPerMetreSource: string | null;
  } = {
    lengthM,
    velocityFactor: row.equipment?.velocityFactor ?? null,
    soundConductor: null,
    conductorOhm: null,
    ohmPerMetre: null,
    ohmPerMetreSource: null,
  };
  for (const s of steps) {
    if (s.testKind !== 'continuity' || involved.has(s.conductors)) continue;
    const latest = readings.find((r) => r.reading.stepId === s.id)?.reading;
    if (latest && latest.verdict !== 'fail' && latest.valueOhm !== null && latest.valueOhm > 0) {
      out.soundConductor = s.conductors;
      out.conductorOhm = latest.valueOhm;
      if (lengthM) out.ohmPerMetre = latest.valueOhm / lengthM;
      out.ohmPerMetreSource = `line ${s.conductors} of this cable, end to end, read ${latest.valueOhm} Ω`;
      return out;
    }
  }
  if (row.equipment?.conductorMm2) {
    try {
      out.ohmPerMetre = ohmPerMetreFromConductorSize({ mm2: row.equipment.conductorMm2 });
      out.ohmPerMetreSource = `IEC 60228 maximum for ${row.equipment.conductorMm2} mm² flexible copper`;
    } catch {
      // A size with no table value: the form asks for Ω per metre.
    }
  }
  return out;
}
