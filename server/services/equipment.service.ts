// The equipment register: tagged items, their calibrations and their history across events.
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import { equipmentRepository, type EquipmentRow } from '../db/equipment.repository';
import { recordAudit } from '../db/audit.repository';
import type { Tx } from '../db/client';
import { conflict, notFound, unprocessable } from '../lib/app-error';
import { requireVersion } from '../http/etag';
import { accessService } from './access.service';
import { newId, nowIso } from '../lib/ids';
import { calibrateVelocityFactor, FaultLocationError } from '../../shared/domain/fault-location';
import type { CalibrationInput, CreateEquipmentInput, UpdateEquipmentInput } from '../../shared/schemas/equipment';
import { bindScope } from './bind';
import { incidentHistory } from './equipment-incidents';

type CreateInput = Omit<CreateEquipmentInput, 'assetTag'> & { assetTag: string };
type UpdateInput = Omit<UpdateEquipmentInput, 'assetTag'> & { assetTag?: string | undefined };

const isUniqueViolation = (err: unknown) =>
  err instanceof Error && 'code' in err && (err as { code?: string }).code === 'SQLITE_CONSTRAINT_UNIQUE';

const duplicateTag = (tag: string) =>
  conflict('duplicate-asset-tag', `The asset tag ${tag} is already in the register; each item needs its own tag.`, {
    errors: [{ path: 'assetTag', message: `${tag} is already used by another item.` }],
  });

/**
 * A new register item and its audit entry, inside the caller's transaction: the register form and
 * the spreadsheet import both add items this way. Returns the new id.
 */
export function insertEquipmentItem(
  tx: Tx,
  user: AuthUser,
  input: CreateInput,
  opts: { createdAt?: string; auditDetail?: Record<string, unknown> } = {},
): string {
  const id = newId();
  equipmentRepository(tx).insert({
    id,
    orgId: user.orgId,
    assetTag: input.assetTag,
    kind: input.kind,
    description: input.description ?? '',
    lengthM: input.lengthM ?? null,
    conductorMm2: input.conductorMm2 ?? null,
    awg: input.awg ?? null,
    cableType: input.cableType ?? null,
    velocityFactor: input.velocityFactor ?? null,
    status: input.status ?? 'in-service',
    notes: input.notes ?? null,
    ...(opts.createdAt ? { createdAt: opts.createdAt } : {}),
  });
  recordAudit(tx, user, 'equipment.created', 'equipment', id, { assetTag: input.assetTag, kind: input.kind, ...opts.auditDetail });
  return id;
}

function scopeOf(deps: AppDeps) {
  const repo = equipmentRepository(deps.db);
  return { deps, repo };
}
type Scope = ReturnType<typeof scopeOf>;

function requireItem({ repo }: Scope, user: AuthUser, id: string): EquipmentRow {
  const item = repo.findById(id);
  if (!item || item.orgId !== user.orgId) throw notFound('That item');
  return item;
}

/** Strips of a drop-null patch: undefined means "leave as is". */
function cleanPatch(_scope: Scope, input: UpdateInput) {
  return Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined)) as Partial<EquipmentRow>;
}

function list({ repo }: Scope, user: AuthUser, f: Parameters<typeof repo.list>[1]) {
  return repo.list(user.orgId, f);
}

function create({ deps, repo }: Scope, user: AuthUser, input: CreateInput) {
  let id: string;
  try {
    id = deps.db.transaction((tx) => {
      if (equipmentRepository(tx).findByTag(user.orgId, input.assetTag)) throw duplicateTag(input.assetTag);
      return insertEquipmentItem(tx, user, input);
    });
  } catch (err) {
    if (isUniqueViolation(err)) throw duplicateTag(input.assetTag);
    throw err;
  }
  return repo.findById(id)!;
}

function update(scope: Scope, user: AuthUser, id: string, ifMatch: string | undefined, input: UpdateInput) {
  const { deps, repo } = scope;
  const patch = cleanPatch(scope, input);
  // Setting the status is the inspection's outcome: the item is no longer waiting to be looked at.
  if (patch.status !== undefined) patch.toInspectIncidentId = null;
  try {
    deps.db.transaction((tx) => {
      const r = equipmentRepository(tx);
      const item = r.findById(id);
      if (!item || item.orgId !== user.orgId) throw notFound('That item');
      const expectedVersion = requireVersion(
        ifMatch,
        item.version,
        (yours, current) =>
          `Someone else changed ${item.assetTag} meanwhile: you edited version ${yours ?? '?'}, the register now holds version ${current}. Reload the item to see their changes, then apply yours again.`,
      );
      if (patch.assetTag && patch.assetTag !== item.assetTag && r.findByTag(user.orgId, patch.assetTag)) {
        throw duplicateTag(patch.assetTag);
      }
      if (patch.kind && patch.kind !== item.kind && r.assignmentsOf(id).some((a) => !a.assignment.removedAt)) {
        throw unprocessable('kind-in-use', `${item.assetTag} sits in a position of a venue plan; take it off before changing its kind.`, {
          errors: [{ path: 'kind', message: 'The item is attached to a position of its current kind.' }],
        });
      }
      r.updateIfVersion(id, expectedVersion, patch);
      const changed = Object.fromEntries(Object.entries(patch).map(([k, v]) => [k, { from: item[k as keyof EquipmentRow], to: v }]));
      recordAudit(tx, user, 'equipment.updated', 'equipment', id, { assetTag: patch.assetTag ?? item.assetTag, changed });
    });
  } catch (err) {
    if (isUniqueViolation(err)) throw duplicateTag(patch.assetTag ?? '');
    throw err;
  }
  return repo.findById(id)!;
}

function calibrate(scope: Scope, user: AuthUser, id: string, input: CalibrationInput) {
  const { deps, repo } = scope;
  const item = requireItem(scope, user, id);
  let result;
  try {
    result = calibrateVelocityFactor(input, user.unitSystem);
  } catch (err) {
    if (err instanceof FaultLocationError) {
      throw unprocessable('calibration-refused', err.message, { errors: [{ path: err.field, message: err.message }] });
    }
    throw err;
  }
  const calibrationId = newId();
  deps.db.transaction((tx) => {
    const r = equipmentRepository(tx);
    r.insertCalibration({
      id: calibrationId,
      equipmentId: id,
      velocityFactor: result.velocityFactor,
      lengthM: input.lengthM,
      roundTripNs: input.roundTripNs,
      createdBy: user.id,
      createdAt: nowIso(),
    });
    r.update(id, { velocityFactor: result.velocityFactor, version: item.version + 1 });
    recordAudit(tx, user, 'equipment.calibrated', 'equipment', id, {
      assetTag: item.assetTag,
      ...input,
      velocityFactor: result.velocityFactor,
      previous: item.velocityFactor,
    });
  });
  return { id: calibrationId, ...result, item: repo.findById(id)! };
}

type ItemReadingRow = ReturnType<Scope['repo']['readingsOf']>[number];

/** One reading of the item's history, with where and by whom it was taken. */
const historyReading = (r: ItemReadingRow) => ({
  id: r.reading.id,
  valueText: r.reading.valueText,
  valueOhm: r.reading.valueOhm,
  verdict: r.reading.verdict,
  limitOhm: r.reading.limitOhm,
  testKind: r.testKind,
  conductors: r.conductors,
  positionName: r.positionName,
  stripId: r.stripId,
  stripLabel: r.stripLabel,
  venueId: r.venueId,
  venueName: r.venueName,
  eventName: r.eventName,
  takenAt: r.reading.takenAt,
  takenByName: r.takenByName,
  supersedesId: r.reading.supersedesId,
});

/**
 * The item with everything that happened to it, across events. A technician sees its history
 * only on the venues they are assigned to (OWASP ASVS 8.2.2): the register is shared, the
 * readings and fault notes of other venues are not.
 */
function detail(scope: Scope, user: AuthUser, id: string) {
  const { deps, repo } = scope;
  const item = requireItem(scope, user, id);
  const visible =
    user.role === 'technician'
      ? new Set(
          accessService(deps.db)
            .visibleVenues(user)
            .map((v) => v.venue.id),
        )
      : null;
  const mayShow = (venueId: string) => visible === null || visible.has(venueId);
  const allRepairs = repo.repairsOf(id);
  const repairs = allRepairs
    .filter((r) => mayShow(r.venueId))
    .map(({ repair, byName }) => ({
      ...repair,
      byName,
      role: repair.equipmentId === id ? ('repaired' as const) : ('replacement' as const),
      lengthAfterM:
        repair.action === 'cut-out' && repair.lengthBeforeM != null && repair.lengthRemovedM != null
          ? Math.round((repair.lengthBeforeM - repair.lengthRemovedM) * 1000) / 1000
          : null,
    }));
  // Every cut counts, wherever it was made (the length is the register's).
  const cutOuts = allRepairs.map((r) => r.repair).filter((r) => r.equipmentId === id && r.action === 'cut-out');
  return {
    item,
    originalLengthM: cutOuts.find((r) => r.lengthBeforeM != null)?.lengthBeforeM ?? null,
    lengthRemovedM: cutOuts.reduce((sum, r) => sum + (r.lengthRemovedM ?? 0), 0),
    readings: repo
      .readingsOf(id)
      .filter((r) => mayShow(r.venueId))
      .map(historyReading),
    faults: repo
      .faultsOf(id)
      .filter((f) => mayShow(f.venueId))
      .map((f) => ({
        ...f.fault,
        positionName: f.positionName,
        stripLabel: f.stripLabel,
        venueId: f.venueId,
        venueName: f.venueName,
        eventName: f.eventName,
      })),
    repairs,
    placements: repo
      .assignmentsOf(id)
      .filter((a) => mayShow(a.venueId))
      .map((a) => ({
        id: a.assignment.id,
        assignedAt: a.assignment.assignedAt,
        removedAt: a.assignment.removedAt,
        positionName: a.positionName,
        stripId: a.stripId,
        stripLabel: a.stripLabel,
        venueId: a.venueId,
        venueName: a.venueName,
        eventId: a.eventId,
        eventName: a.eventName,
      })),
    calibrations: repo.calibrationsOf(id).map((c) => ({ ...c.calibration, byName: c.byName })),
    ...incidentHistory(deps.db, item, mayShow),
  };
}

export function equipmentService(deps: AppDeps) {
  return bindScope(scopeOf(deps), { list, create, update, calibrate, detail });
}
