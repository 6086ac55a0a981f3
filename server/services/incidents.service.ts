// Competition days: an incident suspends its strip (venue signed off), a tested spare is swapped
// in, the strip is retested, and the incident is resolved once the retest is complete.
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import type { Tx } from '../db/client';
import { accessService, type VenueAccessMode } from './access.service';
import { incidentsRepository } from '../db/incidents.repository';
import { planRepository } from '../db/plan.repository';
import { equipmentRepository } from '../db/equipment.repository';
import { faultsRepository } from '../db/faults.repository';
import { recordAudit } from '../db/audit.repository';
import { conflict, notFound, unprocessable } from '../lib/app-error';
import { newId, nowIso } from '../lib/ids';
import { presentIncidents } from '../presenters/incidents';
import { retestOf } from './incident-retest';
import { suspendStripIfSignedOff } from './venue-lifecycle';
import { sparePool } from './spares.service';
import { decideTakenAt } from '../../shared/domain/reading-time';
import type { CreateIncidentInput, SwapInput } from '../../shared/schemas/incidents';

function scopeOf(deps: AppDeps) {
  return { deps, access: accessService(deps.db), repo: incidentsRepository(deps.db) };
}
type Scope = ReturnType<typeof scopeOf>;

function load({ deps, access, repo }: Scope, user: AuthUser, id: string, mode: VenueAccessMode) {
  const row = repo.byId(id);
  if (!row) throw notFound('That incident');
  // Another organisation's incident is not found, like its venue.
  const venue = access.requireVenue(user, row.incident.venueId, mode);
  return { row, venue, deps };
}

function detail(scope: Scope, user: AuthUser, id: string) {
  const { row, venue, deps } = load(scope, user, id, 'read');
  const [incident] = presentIncidents(deps.db, [row]);
  const retest = retestOf(
    deps.db,
    row.incident,
    scope.repo.swapsOf([id]).map((s) => s.swap),
  );
  let mayTest = true;
  try {
    scope.access.requireLoadedVenue(user, venue, 'test');
  } catch {
    mayTest = false;
  }
  return { incident, retest, canResolve: incident.status === 'open' && retest.complete && mayTest };
}

/** The same incident sent again: same venue, strip, position and symptom (the tablet's time may differ). */
function sameIncident(
  seen: { venueId: string; stripId: string; positionId: string | null; symptom: string },
  venueId: string,
  body: CreateIncidentInput,
) {
  return (
    seen.venueId === venueId &&
    seen.stripId === body.stripId &&
    seen.positionId === (body.positionId ?? null) &&
    seen.symptom === body.symptom
  );
}

function open(scope: Scope, user: AuthUser, venueId: string, body: CreateIncidentInput) {
  const { deps, access, repo } = scope;
  access.requireVenue(user, venueId, 'test');
  if (body.clientId) {
    const seen = repo.byClientId(body.clientId);
    if (seen && sameIncident(seen, venueId, body)) return { replayed: true, incident: presentIncidents(deps.db, [repo.byId(seen.id)!])[0] };
    // Never a second incident under one clientId: a tablet reusing it has a bug, not a new fault.
    if (seen)
      throw conflict(
        'client-id-used',
        'This clientId was already used for another incident; make a new one on the tablet and send it again.',
      );
  }
  const { venue } = access.requireVenue(user, venueId, 'read');
  if (venue.status === 'planning')
    throw conflict('venue-planning', 'The venue is still being planned; incidents are for testing and competition days.');
  const plan = planRepository(deps.db);
  const strip = plan.findStrip(body.stripId);
  const bad = (path: string, message: string) => unprocessable('bad-incident', message, { errors: [{ path, message }] });
  if (!strip || strip.venueId !== venueId || strip.sparePool) throw bad('stripId', 'That strip is not in this venue.');
  if (strip.withdrawnAt) throw bad('stripId', `${strip.label} is withdrawn.`);
  const position = body.positionId ? plan.findPosition(body.positionId) : undefined;
  if (body.positionId && (!position || position.strip.id !== strip.id)) throw bad('positionId', `That position is not on ${strip.label}.`);
  const id = newId();
  const receivedAt = nowIso();
  const time = decideTakenAt(body.openedAt, receivedAt);
  deps.db.transaction((tx) => {
    incidentsRepository(tx).insert({
      id,
      venueId,
      stripId: strip.id,
      positionId: position?.position.id ?? null,
      equipmentId: position?.position.equipmentId ?? null,
      symptom: body.symptom,
      clientId: body.clientId ?? null,
      openedBy: user.id,
      openedAt: time.takenAt,
    });
    recordAudit(tx, user, 'incident.opened', 'incident', id, {
      stripId: strip.id,
      positionId: position?.position.id ?? null,
      symptom: body.symptom,
      // As for readings: the tablet's time is kept even when it was not believed.
      ...(time.source === 'tablet' && time.takenAt !== receivedAt ? { openedAt: time.takenAt, receivedAt } : {}),
      ...('refused' in time ? { tabletOpenedAt: time.refused.claimed, tabletClock: time.refused.why } : {}),
    });
    suspendStripIfSignedOff(tx, {
      venueId,
      stripId: strip.id,
      orgId: user.orgId,
      actorId: user.id,
      reason: `Incident on ${strip.label}: ${body.symptom}`,
    });
  });
  return { replayed: false, incident: presentIncidents(deps.db, [repo.byId(id)!])[0] };
}

function list({ deps, access, repo }: Scope, user: AuthUser, venueId: string) {
  const { venue, event } = access.requireVenue(user, venueId, 'read');
  const incidents = presentIncidents(deps.db, repo.ofVenue(venueId));
  return {
    venue: { id: venue.id, name: venue.name, status: venue.status },
    event: { id: event.id, name: event.name, startsOn: event.startsOn, endsOn: event.endsOn },
    incidents,
    toAmend: incidents.filter((i) => i.status === 'resolved' && !i.amendment).map((i) => i.id),
    canAmend: user.role === 'director' && event.directorId === user.id && venue.status === 'signed-off',
  };
}

/** Open faults of the position on the removed item close with a "swapped" repair: the item left the strip. */
function closeFaultsOfRemoved(
  tx: Tx,
  user: AuthUser,
  v: { positionId: string; stripId: string; removedId: string; replacementId: string; at: string },
) {
  const faults = faultsRepository(tx);
  for (const f of faults.unclosedOfStrip(v.stripId)) {
    if (f.fault.positionId !== v.positionId || f.fault.equipmentId !== v.removedId) continue;
    const repairId = newId();
    faults.insertRepair({
      id: repairId,
      faultId: f.fault.id,
      equipmentId: v.removedId,
      action: 'swapped',
      replacementEquipmentId: v.replacementId,
      createdBy: user.id,
      createdAt: v.at,
    });
    faults.update(f.fault.id, f.fault.version, { status: 'closed', closedAt: v.at });
    recordAudit(tx, user, 'fault.repaired', 'fault', f.fault.id, { repairId, action: 'swapped', byIncidentSwap: true });
  }
}

function swap(scope: Scope, user: AuthUser, id: string, body: SwapInput) {
  const { row, deps } = load(scope, user, id, 'test');
  const i = row.incident;
  if (i.status !== 'open') throw conflict('incident-resolved', 'This incident is resolved; open a new one for a new problem.');
  const plan = planRepository(deps.db);
  const position = plan.findPosition(body.positionId);
  const refuse = (path: string, message: string) => unprocessable('bad-swap', message, { errors: [{ path, message }] });
  if (!position || position.strip.id !== i.stripId) throw refuse('positionId', `That position is not on ${row.stripLabel}.`);
  const spare = sparePool(deps.db, i.venueId).spares.find((s) => s.equipment.assetTag === body.replacementAssetTag);
  if (!spare || spare.usedIn)
    throw refuse('replacementAssetTag', `${body.replacementAssetTag} is not an unused spare of this venue's pool.`);
  if (spare.equipment.kind !== position.position.equipmentKind) {
    throw refuse(
      'replacementAssetTag',
      `${body.replacementAssetTag} is a ${spare.equipment.kind}; ${position.position.name} takes a ${position.position.equipmentKind}.`,
    );
  }
  const removedId = position.position.equipmentId;
  const at = nowIso();
  deps.db.transaction((tx) => {
    const items = equipmentRepository(tx);
    // The spare leaves the pool (its position and readings stay there) and goes into the strip.
    items.assignToPosition(spare.positionId, null, user.id, at);
    items.assignToPosition(position.position.id, spare.equipment.id, user.id, at);
    if (removedId) {
      const removed = items.findById(removedId)!;
      items.update(removedId, { toInspectIncidentId: id, version: removed.version + 1 });
      closeFaultsOfRemoved(tx, user, {
        positionId: position.position.id,
        stripId: i.stripId,
        removedId,
        replacementId: spare.equipment.id,
        at,
      });
      recordAudit(tx, user, 'equipment.to-inspect', 'equipment', removedId, { incidentId: id });
    }
    const swapId = newId();
    incidentsRepository(tx).insertSwap({
      id: swapId,
      incidentId: id,
      positionId: position.position.id,
      removedEquipmentId: removedId,
      replacementEquipmentId: spare.equipment.id,
      sparePositionId: spare.positionId,
      spareTested: spare.tested,
      createdBy: user.id,
      createdAt: at,
    });
    recordAudit(tx, user, 'incident.swapped', 'incident', id, {
      swapId,
      positionId: position.position.id,
      removedEquipmentId: removedId,
      replacement: body.replacementAssetTag,
      spareTested: spare.tested,
    });
    suspendStripIfSignedOff(tx, {
      venueId: i.venueId,
      stripId: i.stripId,
      orgId: user.orgId,
      actorId: user.id,
      reason: `Swap on ${row.stripLabel}, ${position.position.name}`,
    });
  });
  return detail(scope, user, id);
}

function resolve(scope: Scope, user: AuthUser, id: string) {
  const { row, deps } = load(scope, user, id, 'test');
  if (row.incident.status !== 'open') throw conflict('incident-resolved', 'This incident is resolved already.');
  const retest = retestOf(
    deps.db,
    row.incident,
    scope.repo.swapsOf([id]).map((s) => s.swap),
  );
  if (!retest.complete) {
    const faults = retest.openFaults > 0 ? ` and ${retest.openFaults} fault(s) on the strip are still open` : '';
    throw conflict('retest-incomplete', `${row.stripLabel} is not ready: ${retest.missing.length} step(s) still to pass${faults}.`, {
      missing: retest.missing,
      openFaults: retest.openFaults,
    });
  }
  const at = nowIso();
  deps.db.transaction((tx) => {
    incidentsRepository(tx).update(id, { status: 'resolved', resolvedAt: at, resolvedBy: user.id });
    recordAudit(tx, user, 'incident.resolved', 'incident', id, { stripId: row.incident.stripId, steps: retest.steps.length });
  });
  return detail(scope, user, id);
}

export function incidentsService(deps: AppDeps) {
  const scope = scopeOf(deps);
  return {
    open: (user: AuthUser, venueId: string, body: CreateIncidentInput) => open(scope, user, venueId, body),
    list: (user: AuthUser, venueId: string) => list(scope, user, venueId),
    get: (user: AuthUser, id: string) => detail(scope, user, id),
    swap: (user: AuthUser, id: string, body: SwapInput) => swap(scope, user, id, body),
    resolve: (user: AuthUser, id: string) => resolve(scope, user, id),
  };
}
