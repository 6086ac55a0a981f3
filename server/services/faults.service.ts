// Faults: the record a failure opens, its location estimates, its repair and its retest.
import { z } from 'zod';
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import type { Db, Tx } from '../db/client';
import { faultsRepository, type FaultEstimateRow, type FaultListRow } from '../db/faults.repository';
import { stripsRepository } from '../db/strips.repository';
import { equipmentRepository, type EquipmentRow } from '../db/equipment.repository';
import { writeAudit } from '../db/audit.repository';
import { accessService } from './access.service';
import { reopenIfSignedOff } from './venue-lifecycle';
import { presentReading } from './readings.service';
import { conflict, notFound, preconditionFailed, unprocessable, AppError } from '../lib/app-error';
import { newId, nowIso } from '../lib/ids';
import {
  combineEstimates,
  FaultLocationError,
  ohmPerMetreFromConductorSize,
  runFaultLocation,
  type FaultEstimate,
} from '../../shared/domain/fault-location';
import { faultLocationRequestSchema } from '../../shared/schemas/fault-location';
import { formatLength, type LengthSystem } from '../../shared/domain/units';
import { fromEndSchema, type CreateFaultInput, type CreateRepairInput, type DismissFaultInput, type UpdateFaultInput } from '../../shared/schemas/faults';

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
function presentEstimate(row: FaultEstimateRow, lengthM: number | null, createdByName: string | null | undefined, units?: LengthSystem) {
  const result = JSON.parse(row.resultJson) as { explanation?: string; fromOtherEndM?: number; faultOhm?: number; velocityFactor?: number };
  return {
    id: row.id,
    method: row.method,
    fromEnd: row.fromEnd as 'near' | 'far',
    distanceM: row.distanceM,
    fromOtherEndM: result.fromOtherEndM ?? (lengthM !== null ? lengthM - row.distanceM : null),
    uncertaintyM: row.uncertaintyM,
    /** From the near (apparatus) end, whichever end it was measured from, when the length is known. */
    distanceFromNearM: row.fromEnd === 'far' ? (lengthM !== null ? lengthM - row.distanceM : null) : row.distanceM,
    faultOhm: result.faultOhm ?? null,
    explanation: units ? explanationFor(row, result.explanation ?? '', units) : (result.explanation ?? ''),
    inputs: JSON.parse(row.inputsJson) as Record<string, number>,
    createdAt: row.createdAt,
    createdBy: row.createdBy,
    createdByName: createdByName ?? null,
  };
}
type EstimateDto = ReturnType<typeof presentEstimate>;

/**
 * All estimates of a fault, brought to the near end and weighed together, with the disagreement
 * flag. Worked out on each read, so its explanation is in the reader's units.
 */
function combine(estimates: EstimateDto[], units: LengthSystem = 'metric') {
  const usable = estimates.filter((e) => e.distanceFromNearM !== null && e.uncertaintyM > 0);
  if (usable.length === 0) return null;
  const asDomain: FaultEstimate[] = usable.map((e) => ({
    method: e.method,
    distanceM: e.distanceFromNearM as number,
    uncertaintyM: e.uncertaintyM,
    explanation: e.explanation,
    inputs: e.inputs,
  }));
  const c = combineEstimates(asDomain, units);
  return { ...c, count: usable.length, fromEnd: 'near' as const };
}

/** The one estimate shown in lists: the combination when there are several, else the latest. */
function summaryEstimate(estimates: EstimateDto[]) {
  if (estimates.length === 0) return null;
  const combined = estimates.length > 1 ? combine(estimates) : null;
  if (combined) {
    return { method: 'combined', distanceM: combined.distanceM, uncertaintyM: combined.uncertaintyM, fromEnd: 'near' as const, count: combined.count, agree: combined.agree };
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

export const faultEtag = (version: number) => `"${version}"`;

function checkIfMatch(ifMatch: string | undefined, version: number) {
  if (!ifMatch) {
    throw new AppError(428, 'if-match-required', 'Send If-Match with the ETag of the fault you loaded, so a change made meanwhile is not overwritten.');
  }
  const tags = ifMatch.split(',').map((t) => t.trim().replace(/^W\//, ''));
  if (!tags.includes('*') && !tags.includes(faultEtag(version))) {
    throw preconditionFailed('This fault was changed by someone else since you loaded it. Reload it and make your change again.', {
      currentVersion: version,
    });
  }
}

export function faultsService(deps: AppDeps) {
  const access = accessService(deps.db);

  function load(user: AuthUser, id: string, mode: 'read' | 'test' | 'direct') {
    const row = faultsRepository(deps.db).findById(id);
    if (!row) throw notFound('That fault');
    const venue = access.requireVenue(user, row.venueId, mode);
    return { ...row, event: venue.event };
  }

  function detail(user: AuthUser, id: string) {
    const row = load(user, id, 'read');
    const repo = faultsRepository(deps.db);
    const strips = stripsRepository(deps.db);
    const [listItem] = presentFaultList(deps.db, [row], user.unitSystem);
    const lengthM = row.equipment?.lengthM ?? null;
    const estimates = repo.estimatesOf([id]).map((e) => presentEstimate(e.estimate, lengthM, e.createdByName, user.unitSystem));
    const steps = strips.activeStepsOf([row.fault.positionId]);
    const readings = strips.readingsOfSteps(steps.map((s) => s.id));
    const position = strips.positionContext(row.fault.positionId);
    return {
      ...listItem!,
      // Only the event's own director may dismiss a fault that was a typing mistake.
      canDismiss: user.role === 'director' && row.event.directorId === user.id && row.fault.status !== 'closed' && row.fault.status !== 'repaired',
      lengthM,
      currentEquipment: presentEquipment(position?.equipment ?? null),
      estimates,
      combined: combine(estimates, user.unitSystem),
      repairs: repo.repairsOf(id).map(({ repair, createdByName }) => ({ ...repair, createdByName })),
      steps: steps.map((s) => {
        const own = readings.filter((r) => r.reading.stepId === s.id);
        return {
          id: s.id,
          testKind: s.testKind,
          conductors: s.conductors,
          required: s.required,
          latest: own[0] ? presentReading(own[0].reading, own[0].takenByName) : null,
          readings: own.map((r) => presentReading(r.reading, r.takenByName)),
        };
      }),
      prefill: prefillFor(row, steps, readings),
    };
  }

  /**
   * What the locating forms can start from: the length, and Ω per metre from the cable's own
   * continuity reading of a sound conductor (one not involved in the fault), else from its size.
   */
  function prefillFor(
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
    } = { lengthM, velocityFactor: row.equipment?.velocityFactor ?? null, soundConductor: null, conductorOhm: null, ohmPerMetre: null, ohmPerMetreSource: null };
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

  function list(user: AuthUser, venueId: string) {
    access.requireVenue(user, venueId, 'read');
    return presentFaultList(deps.db, faultsRepository(deps.db).ofVenue(venueId));
  }

  function create(user: AuthUser, body: CreateFaultInput) {
    const strips = stripsRepository(deps.db);
    const ctx = strips.positionContext(body.positionId);
    if (!ctx) throw notFound('That position');
    access.requireVenue(user, ctx.venue.id, 'test');
    if (body.stepId) {
      const step = strips.stepContext(body.stepId);
      if (!step || step.position.id !== body.positionId) {
        throw unprocessable('bad-step', 'The step must belong to the position.', { errors: [{ path: 'stepId', message: 'Not a step of this position' }] });
      }
    }
    const id = newId();
    deps.db.transaction((tx) => {
      faultsRepository(tx).insert({
        id,
        stripId: ctx.strip.id,
        positionId: ctx.position.id,
        equipmentId: ctx.position.equipmentId,
        stepId: body.stepId ?? null,
        kind: body.kind,
        conductors: body.conductors,
        notes: body.notes ?? null,
        status: 'open',
        openedBy: user.id,
        openedAt: nowIso(),
      });
      writeAudit(tx, {
        orgId: user.orgId,
        actorId: user.id,
        action: 'fault.opened',
        entityType: 'fault',
        entityId: id,
        detail: { kind: body.kind, conductors: body.conductors, automatic: false },
      });
      // A fault on a signed-off venue: its certificates no longer say all of it.
      reopenIfSignedOff(tx, { venueId: ctx.venue.id, orgId: user.orgId, actorId: user.id, reason: `Fault opened on ${ctx.strip.label}, ${ctx.position.name}` });
    });
    return detail(user, id);
  }

  function update(user: AuthUser, id: string, ifMatch: string | undefined, body: UpdateFaultInput) {
    const row = load(user, id, 'test');
    checkIfMatch(ifMatch, row.fault.version);
    deps.db.transaction((tx) => {
      const patch: Parameters<ReturnType<typeof faultsRepository>['update']>[2] = {};
      if (body.notes !== undefined) patch.notes = body.notes;
      if (body.kind !== undefined) patch.kind = body.kind;
      if (body.status !== undefined) {
        // Only open or located: an edit never closes a fault. Re-opening one that was closed
        // takes its dismissal off the fault (the audit entry below keeps it).
        patch.status = body.status;
        patch.closedAt = null;
        if (row.fault.dismissedAt) Object.assign(patch, { dismissedAt: null, dismissedBy: null, dismissedReason: null });
      }
      if (!faultsRepository(tx).update(id, row.fault.version, patch)) {
        throw preconditionFailed('This fault was changed by someone else since you loaded it. Reload it and make your change again.');
      }
      writeAudit(tx, {
        orgId: user.orgId,
        actorId: user.id,
        action: 'fault.updated',
        entityType: 'fault',
        entityId: id,
        detail: {
          before: {
            notes: row.fault.notes,
            kind: row.fault.kind,
            status: row.fault.status,
            ...(row.fault.dismissedAt ? { dismissedAt: row.fault.dismissedAt, dismissedBy: row.fault.dismissedBy, dismissedReason: row.fault.dismissedReason } : {}),
          },
          after: body,
        },
      });
    });
    return detail(user, id);
  }

  function addEstimate(user: AuthUser, id: string, raw: unknown) {
    const row = load(user, id, 'test');
    if (row.fault.status === 'closed') throw conflict('fault-closed', 'This fault is closed; open a new one to locate another.');
    const { fromEnd: fromEndRaw, ...rest } = (raw && typeof raw === 'object' ? raw : {}) as Record<string, unknown>;
    const fromEnd = fromEndRaw === undefined ? 'near' : z.object({ fromEnd: fromEndSchema }).parse({ fromEnd: fromEndRaw }).fromEnd;
    const lengthM = row.equipment?.lengthM ?? null;
    // What is known about the item fills what the reading form left out.
    if (rest.lengthM === undefined && lengthM !== null && rest.method !== 'vf-calibration') rest.lengthM = lengthM;
    const request = faultLocationRequestSchema.parse(rest);
    if (request.method === 'vf-calibration') {
      throw unprocessable('not-a-location', 'Velocity-factor calibration is done on a good cable, not on a fault.', {
        errors: [{ path: 'method', message: 'Use tdr, loop-one-end, loop-both-ends, murray, capacitance or flex' }],
      });
    }
    let answer;
    try {
      // Saved in the saver's units; readers see it worded in theirs (explanationFor).
      answer = runFaultLocation(request, user.unitSystem);
    } catch (err) {
      if (err instanceof FaultLocationError) {
        throw unprocessable(err.code, err.message, { errors: [{ path: err.field, message: err.message }] });
      }
      throw err;
    }
    const estimateId = newId();
    deps.db.transaction((tx) => {
      const repo = faultsRepository(tx);
      repo.insertEstimate({
        id: estimateId,
        faultId: id,
        method: request.method,
        fromEnd,
        inputsJson: JSON.stringify(request),
        distanceM: answer.distanceM,
        uncertaintyM: answer.uncertaintyM,
        resultJson: JSON.stringify(answer),
        createdBy: user.id,
        createdAt: nowIso(),
      });
      const status = row.fault.status === 'open' ? 'located' : row.fault.status;
      repo.update(id, row.fault.version, { status });
      writeAudit(tx, {
        orgId: user.orgId,
        actorId: user.id,
        action: 'fault.estimated',
        entityType: 'fault',
        entityId: id,
        detail: { estimateId, method: request.method, fromEnd, distanceM: answer.distanceM, uncertaintyM: answer.uncertaintyM },
      });
    });
    const fault = detail(user, id);
    return { estimate: fault.estimates.find((e) => e.id === estimateId)!, combined: fault.combined, fault };
  }

  function addRepair(user: AuthUser, id: string, body: CreateRepairInput) {
    const row = load(user, id, 'test');
    if (row.fault.status === 'closed') throw conflict('fault-closed', 'This fault is closed; a repair goes on an open fault.');
    const strips = stripsRepository(deps.db);
    const position = strips.positionContext(row.fault.positionId)!;
    const item = row.equipment ?? position.equipment;
    const at = nowIso();
    const repairId = newId();

    deps.db.transaction((tx) => {
      const equipment = equipmentRepository(tx);
      const faults = faultsRepository(tx);
      let lengthBeforeM: number | null = null;
      let replacementId: string | null = null;

      if ((body.action === 'cut-out' || body.action === 'retired' || body.action === 'swapped') && !item) {
        throw unprocessable('no-item', 'No register item is recorded for this fault, so there is nothing to repair here.');
      }
      if (body.action === 'cut-out') {
        const before = item!.lengthM;
        if (before === null) {
          throw unprocessable('no-length', `The length of ${item!.assetTag} is not recorded; record it in the equipment register first.`, {
            errors: [{ path: 'lengthRemovedM', message: 'The item has no recorded length' }],
          });
        }
        if (body.lengthRemovedM! >= before) {
          // Worded in the person's units: the form shows this under the field they typed in.
          const [cut, whole] = [formatLength(body.lengthRemovedM!, user.unitSystem), formatLength(before, user.unitSystem)];
          throw unprocessable('cut-too-long', `${cut} is not less than the ${whole} of ${item!.assetTag}; retire the item instead.`, {
            errors: [{ path: 'lengthRemovedM', message: `Must be less than the item's ${whole}` }],
          });
        }
        lengthBeforeM = before;
        // Millimetre resolution: 12 − 1.5 stays 10.5, not 10.499999999999998.
        const after = Math.round((before - body.lengthRemovedM!) * 1000) / 1000;
        equipment.update(item!.id, { lengthM: after, version: item!.version + 1 });
      }
      if (body.action === 'swapped') {
        const replacement = equipment.findByTag(user.orgId, body.replacementAssetTag!);
        const refuse = (message: string) =>
          unprocessable('bad-replacement', message, { errors: [{ path: 'replacementAssetTag', message }] });
        if (!replacement) throw refuse(`No item with asset tag ${body.replacementAssetTag} in the register.`);
        if (replacement.id === item!.id) throw refuse('The replacement is the same item.');
        if (replacement.kind !== item!.kind) throw refuse(`${replacement.assetTag} is a ${replacement.kind}, not a ${item!.kind}.`);
        if (replacement.status !== 'in-service') throw refuse(`${replacement.assetTag} is not in service (${replacement.status}).`);
        const holder = faults.stripHoldingItem(position.venue.id, replacement.id);
        if (holder) throw refuse(`${replacement.assetTag} is already on ${holder.stripLabel} of this venue.`);
        replacementId = replacement.id;
        equipment.assignToPosition(position.position.id, replacement.id, user.id, at);
        equipment.update(item!.id, { status: 'under-repair', version: item!.version + 1 });
      }
      if (body.action === 'retired') {
        equipment.update(item!.id, { status: 'retired', version: item!.version + 1 });
        equipment.assignToPosition(position.position.id, null, user.id, at);
      }

      faults.insertRepair({
        id: repairId,
        faultId: id,
        equipmentId: item?.id ?? null,
        action: body.action,
        lengthRemovedM: body.lengthRemovedM ?? null,
        lengthBeforeM,
        replacementEquipmentId: replacementId,
        notes: body.notes ?? null,
        createdBy: user.id,
        createdAt: at,
      });
      faults.update(id, row.fault.version, { status: 'repaired' });
      writeAudit(tx, {
        orgId: user.orgId,
        actorId: user.id,
        action: 'fault.repaired',
        entityType: 'fault',
        entityId: id,
        detail: { repairId, action: body.action, equipmentId: item?.id ?? null, lengthBeforeM, lengthRemovedM: body.lengthRemovedM ?? null, replacementId },
      });
      if (item && body.action !== 'connector-remade') {
        writeAudit(tx, {
          orgId: user.orgId,
          actorId: user.id,
          action: `equipment.${body.action}`,
          entityType: 'equipment',
          entityId: item.id,
          detail: { faultId: id, repairId },
        });
      }
      reopenIfSignedOff(tx, {
        venueId: position.venue.id,
        orgId: user.orgId,
        actorId: user.id,
        reason: `Repair (${body.action}) on ${position.strip.label}, ${position.position.name}`,
      });
    });
    const fault = detail(user, id);
    return { repair: fault.repairs.find((r) => r.id === repairId)!, fault };
  }

  /**
   * The event's director closes a fault that was a typing mistake, with a reason of at least a
   * sentence: kept on the fault, in the audit trail and on the certificate. Any other fault closes
   * by a repair and a passing retest. A repaired fault waits for its retest, so it is not dismissed.
   */
  function dismiss(user: AuthUser, id: string, ifMatch: string | undefined, body: DismissFaultInput) {
    const row = load(user, id, 'direct');
    checkIfMatch(ifMatch, row.fault.version);
    if (row.fault.status === 'closed') throw conflict('fault-closed', 'This fault is closed already.');
    if (row.fault.status === 'repaired') {
      throw conflict('fault-repaired', 'A repair was recorded on this fault: it closes when the retest passes, not by a dismissal.');
    }
    const at = nowIso();
    deps.db.transaction((tx) => {
      const changed = faultsRepository(tx).update(id, row.fault.version, {
        status: 'closed',
        closedAt: at,
        dismissedAt: at,
        dismissedBy: user.id,
        dismissedReason: body.reason,
      });
      if (!changed) throw preconditionFailed('This fault was changed by someone else since you loaded it. Reload it and decide again.');
      writeAudit(tx, {
        orgId: user.orgId,
        actorId: user.id,
        action: 'fault.dismissed',
        entityType: 'fault',
        entityId: id,
        detail: { reason: body.reason, previousStatus: row.fault.status, readingId: row.fault.readingId, stripId: row.fault.stripId },
      });
      // The record of a signed-off venue changed: its certificates no longer say all of it.
      reopenIfSignedOff(tx, {
        venueId: row.venueId,
        orgId: user.orgId,
        actorId: user.id,
        reason: `Fault dismissed on ${row.stripLabel}, ${row.positionName}`,
      });
    });
    return detail(user, id);
  }

  return { list, detail, create, update, addEstimate, addRepair, dismiss };
}
