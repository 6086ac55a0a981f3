// Faults: the record a failure opens, its location estimates, its repair and its retest.
import { z } from 'zod';
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import { faultsRepository } from '../db/faults.repository';
import { stripsRepository } from '../db/strips.repository';
import { equipmentRepository } from '../db/equipment.repository';
import { recordAudit } from '../db/audit.repository';
import { accessService } from './access.service';
import { suspendStripIfSignedOff } from './venue-lifecycle';
import { conflict, notFound, preconditionFailed, unprocessable, AppError } from '../lib/app-error';
import { newId, nowIso } from '../lib/ids';
import { FaultLocationError, runFaultLocation } from '../../shared/domain/fault-location';
import { faultLocationRequestSchema } from '../../shared/schemas/fault-location';
import { LOCATE_METHODS } from '../../shared/domain/fault-methods';
import { combine, prefillFor, presentEquipment, presentEstimate, presentFaultList } from '../presenters/faults';
import { presentReading } from '../presenters/readings';
import {
  fromEndSchema,
  type CreateFaultInput,
  type CreateRepairInput,
  type DismissFaultInput,
  type UpdateFaultInput,
} from '../../shared/schemas/faults';
import { bindScope } from './bind';
import { cutOut, swapIn } from './item-repairs';

export const faultEtag = (version: number) => `"${version}"`;

function checkIfMatch(ifMatch: string | undefined, version: number) {
  if (!ifMatch) {
    throw new AppError(
      428,
      'if-match-required',
      'Send If-Match with the ETag of the fault you loaded, so a change made meanwhile is not overwritten.',
    );
  }
  const tags = ifMatch.split(',').map((t) => t.trim().replace(/^W\//, ''));
  if (!tags.includes('*') && !tags.includes(faultEtag(version))) {
    throw preconditionFailed('This fault was changed by someone else since you loaded it. Reload it and make your change again.', {
      currentVersion: version,
    });
  }
}

function scopeOf(deps: AppDeps) {
  const access = accessService(deps.db);
  return { deps, access };
}
type Scope = ReturnType<typeof scopeOf>;

function load({ deps, access }: Scope, user: AuthUser, id: string, mode: 'read' | 'test' | 'direct') {
  const row = faultsRepository(deps.db).findById(id);
  if (!row) throw notFound('That fault');
  const venue = access.requireVenue(user, row.venueId, mode);
  return { ...row, event: venue.event };
}

function detail(scope: Scope, user: AuthUser, id: string) {
  const { deps } = scope;
  const row = load(scope, user, id, 'read');
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
    canDismiss:
      user.role === 'director' && row.event.directorId === user.id && row.fault.status !== 'closed' && row.fault.status !== 'repaired',
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

function list({ deps, access }: Scope, user: AuthUser, venueId: string) {
  access.requireVenue(user, venueId, 'read');
  return presentFaultList(deps.db, faultsRepository(deps.db).ofVenue(venueId));
}

function create(scope: Scope, user: AuthUser, body: CreateFaultInput) {
  const { deps, access } = scope;
  const strips = stripsRepository(deps.db);
  const ctx = strips.positionContext(body.positionId);
  if (!ctx) throw notFound('That position');
  access.requireVenue(user, ctx.venue.id, 'test');
  if (body.stepId) {
    const step = strips.stepContext(body.stepId);
    if (!step || step.position.id !== body.positionId) {
      throw unprocessable('bad-step', 'The step must belong to the position.', {
        errors: [{ path: 'stepId', message: 'Not a step of this position' }],
      });
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
    recordAudit(tx, user, 'fault.opened', 'fault', id, { kind: body.kind, conductors: body.conductors, automatic: false });
    // A fault on a signed-off venue: its strip's certificate no longer says all of it.
    suspendStripIfSignedOff(tx, {
      venueId: ctx.venue.id,
      stripId: ctx.strip.id,
      orgId: user.orgId,
      actorId: user.id,
      reason: `Fault opened on ${ctx.strip.label}, ${ctx.position.name}`,
    });
  });
  return detail(scope, user, id);
}

function update(scope: Scope, user: AuthUser, id: string, ifMatch: string | undefined, body: UpdateFaultInput) {
  const { deps } = scope;
  const row = load(scope, user, id, 'test');
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
    recordAudit(tx, user, 'fault.updated', 'fault', id, {
      before: {
        notes: row.fault.notes,
        kind: row.fault.kind,
        status: row.fault.status,
        ...(row.fault.dismissedAt
          ? { dismissedAt: row.fault.dismissedAt, dismissedBy: row.fault.dismissedBy, dismissedReason: row.fault.dismissedReason }
          : {}),
      },
      after: body,
    });
  });
  return detail(scope, user, id);
}

function addEstimate(scope: Scope, user: AuthUser, id: string, raw: unknown) {
  const { deps } = scope;
  const row = load(scope, user, id, 'test');
  if (row.fault.status === 'closed') throw conflict('fault-closed', 'This fault is closed; open a new one to locate another.');
  const { fromEnd: fromEndRaw, ...rest } = (raw && typeof raw === 'object' ? raw : {}) as Record<string, unknown>;
  const fromEnd = fromEndRaw === undefined ? 'near' : z.object({ fromEnd: fromEndSchema }).parse({ fromEnd: fromEndRaw }).fromEnd;
  const lengthM = row.equipment?.lengthM ?? null;
  // What is known about the item fills what the reading form left out.
  if (rest.lengthM === undefined && lengthM !== null && rest.method !== 'vf-calibration') rest.lengthM = lengthM;
  const request = faultLocationRequestSchema.parse(rest);
  if (request.method === 'vf-calibration') {
    throw unprocessable('not-a-location', 'Velocity-factor calibration is done on a good cable, not on a fault.', {
      errors: [{ path: 'method', message: `Use ${LOCATE_METHODS.join(', ')}` }],
    });
  }
  let answer;
  try {
    // Saved in the saver's units; readers see it worded in theirs (explanationFor).
    answer = runFaultLocation(request, user.unitSystem, { maxCableLengthM: deps.env.FAULT_MAX_CABLE_LENGTH_M });
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
      itemLengthM: lengthM,
      createdBy: user.id,
      createdAt: nowIso(),
    });
    const status = row.fault.status === 'open' ? 'located' : row.fault.status;
    repo.update(id, row.fault.version, { status });
    recordAudit(tx, user, 'fault.estimated', 'fault', id, {
      estimateId,
      method: request.method,
      fromEnd,
      distanceM: answer.distanceM,
      uncertaintyM: answer.uncertaintyM,
    });
  });
  const fault = detail(scope, user, id);
  return { estimate: fault.estimates.find((e) => e.id === estimateId)!, combined: fault.combined, fault };
}

function addRepair(scope: Scope, user: AuthUser, id: string, body: CreateRepairInput) {
  const { deps } = scope;
  const row = load(scope, user, id, 'test');
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
    if (body.action === 'cut-out') lengthBeforeM = cutOut(tx, user, item!, body.lengthRemovedM!);
    if (body.action === 'swapped') replacementId = swapIn(tx, user, position, item!, body.replacementAssetTag!, at);
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
    recordAudit(tx, user, 'fault.repaired', 'fault', id, {
      repairId,
      action: body.action,
      equipmentId: item?.id ?? null,
      lengthBeforeM,
      lengthRemovedM: body.lengthRemovedM ?? null,
      replacementId,
    });
    if (item && body.action !== 'connector-remade') {
      recordAudit(tx, user, `equipment.${body.action}`, 'equipment', item.id, { faultId: id, repairId });
    }
    suspendStripIfSignedOff(tx, {
      venueId: position.venue.id,
      stripId: position.strip.id,
      orgId: user.orgId,
      actorId: user.id,
      reason: `Repair (${body.action}) on ${position.strip.label}, ${position.position.name}`,
    });
  });
  const fault = detail(scope, user, id);
  return { repair: fault.repairs.find((r) => r.id === repairId)!, fault };
}

/**
 * The event's director closes a fault that was a typing mistake, with a reason of at least a
 * sentence: kept on the fault, in the audit trail and on the certificate. Any other fault closes
 * by a repair and a passing retest. A repaired fault waits for its retest, so it is not dismissed.
 */
function dismiss(scope: Scope, user: AuthUser, id: string, ifMatch: string | undefined, body: DismissFaultInput) {
  const { deps } = scope;
  const row = load(scope, user, id, 'direct');
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
    recordAudit(tx, user, 'fault.dismissed', 'fault', id, {
      reason: body.reason,
      previousStatus: row.fault.status,
      readingId: row.fault.readingId,
      stripId: row.fault.stripId,
    });
    // The record of a signed-off strip changed: its certificate no longer says all of it.
    suspendStripIfSignedOff(tx, {
      venueId: row.venueId,
      stripId: row.fault.stripId,
      orgId: user.orgId,
      actorId: user.id,
      reason: `Fault dismissed on ${row.stripLabel}, ${row.positionName}`,
    });
  });
  return detail(scope, user, id);
}

export function faultsService(deps: AppDeps) {
  return bindScope(scopeOf(deps), { list, detail, create, update, addEstimate, addRepair, dismiss });
}
