// A venue's plan as a whole: the plan itself, a new venue (empty or cloned from an earlier one),
// its details and profile, strips added in bulk, and its technicians.
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import type { Tx } from '../db/client';
import { planRepository } from '../db/plan.repository';
import { equipmentRepository } from '../db/equipment.repository';
import { recordAudit } from '../db/audit.repository';
import { accessService } from './access.service';
import { editPlan, insertPosition, profileOf, readPlan, requireProfileOfOrg, syncLoopSteps, type VenueCtx } from './plan-edit';
import { toLimitProfile } from '../presenters/profiles';
import { conflict, notFound, unprocessable } from '../lib/app-error';
import { newId, nowIso } from '../lib/ids';
import { DEFAULT_POSITION_TEMPLATE } from '../../shared/domain/checklist';
import type { BulkStripsInput, CreateVenueInput, UpdateVenueInput } from '../../shared/schemas/plan';

/** Strips, positions, items (unless told not to) and active steps of the source venue; no readings. */
function copyVenue(tx: Tx, user: AuthUser, source: VenueCtx, venueId: string, input: CreateVenueInput, at: string) {
  const r = planRepository(tx);
  const eq = equipmentRepository(tx);
  const copied = { strips: 0, positions: 0, steps: 0, items: 0, technicians: 0 };
  const srcSteps = r.stepsOfVenue(source.venue.id).filter((s) => !s.removedAt);
  const srcPositions = r.positionsOfVenue(source.venue.id);
  for (const s of r.stripsOf(source.venue.id)) {
    const stripId = newId();
    r.insertStrip({ id: stripId, venueId, label: s.label, sortOrder: s.sortOrder, zone: s.zone, conductivePiste: s.conductivePiste });
    copied.strips += 1;
    for (const { position, equipment } of srcPositions.filter((p) => p.position.stripId === s.id)) {
      const positionId = newId();
      r.insertPosition({
        id: positionId,
        stripId,
        name: position.name,
        equipmentKind: position.equipmentKind,
        sortOrder: position.sortOrder,
      });
      copied.positions += 1;
      if (input.copyEquipment !== false && equipment && equipment.status !== 'retired') {
        eq.assignToPosition(positionId, equipment.id, user.id, at);
        copied.items += 1;
      }
      for (const st of srcSteps.filter((x) => x.positionId === position.id)) {
        r.insertStep({
          id: newId(),
          positionId,
          testKind: st.testKind,
          conductors: st.conductors,
          sortOrder: st.sortOrder,
          required: st.required,
          addedByDirector: st.addedByDirector,
        });
        copied.steps += 1;
      }
    }
  }
  if (input.copyTechnicians) {
    const techs = r.techniciansOf(source.venue.id).map((t) => t.id);
    r.setTechnicians(venueId, techs);
    copied.technicians = techs.length;
  }
  return copied;
}

/** A new venue of an event, empty or cloned from an earlier venue (strips, positions, steps; no readings). */
function createVenue(deps: AppDeps, user: AuthUser, eventId: string, input: CreateVenueInput) {
  const repo = planRepository(deps.db);
  const event = repo.findEvent(eventId);
  if (!event || event.orgId !== user.orgId) throw notFound('That event');
  const profileRow = requireProfileOfOrg(deps.db, user, input.profileId);
  const source = input.cloneFromVenueId ? accessService(deps.db).requireVenue(user, input.cloneFromVenueId, 'read') : null;
  const venueId = newId();
  deps.db.transaction((tx) => {
    const at = nowIso();
    planRepository(tx).insertVenue({
      id: venueId,
      eventId,
      name: input.name,
      profileId: profileRow.id,
      clonedFromId: source?.venue.id ?? null,
      // A clone is usually the same hall or the same city; otherwise the column's default.
      ...(input.timeZone || source ? { timeZone: input.timeZone ?? source!.venue.timeZone } : {}),
    });
    const copied = source ? copyVenue(tx, user, source, venueId, input, at) : null;
    // The checklist follows the new venue's profile (loop steps where it asks for them).
    if (source) syncLoopSteps(tx, venueId, toLimitProfile(profileRow), at);
    recordAudit(tx, user, source ? 'venue.cloned' : 'venue.created', 'venue', venueId, {
      name: input.name,
      eventId,
      profileId: profileRow.id,
      ...(source ? { fromVenueId: source.venue.id, fromVenueName: source.venue.name, copied } : {}),
    });
  });
  return readPlan(deps.db, user, venueId);
}

function updateVenue(deps: AppDeps, user: AuthUser, venueId: string, ifMatch: string | undefined, input: UpdateVenueInput) {
  return editPlan(deps, user, venueId, ifMatch, 'venue details', (tx, { venue }) => {
    const patch: { name?: string; profileId?: string; timeZone?: string } = {};
    if (input.name !== undefined && input.name !== venue.name) patch.name = input.name;
    if (input.timeZone !== undefined && input.timeZone !== venue.timeZone) patch.timeZone = input.timeZone;
    if (input.profileId !== undefined && input.profileId !== venue.profileId) {
      const row = requireProfileOfOrg(tx, user, input.profileId);
      patch.profileId = row.id;
      syncLoopSteps(tx, venueId, toLimitProfile(row), nowIso());
    }
    if (input.technicianIds !== undefined) applyTechnicians(tx, user, venueId, input.technicianIds, 'technicianIds');
    // Saving the details unchanged is not an error; there is just nothing to write.
    if (Object.keys(patch).length === 0) return;
    planRepository(tx).updateVenue(venueId, patch);
    recordAudit(tx, user, 'venue.updated', 'venue', venueId, {
      venueId,
      changed: Object.fromEntries(Object.entries(patch).map(([k, v]) => [k, { from: venue[k as keyof typeof venue], to: v }])),
    });
  });
}

function addStrips(deps: AppDeps, user: AuthUser, venueId: string, ifMatch: string | undefined, input: BulkStripsInput) {
  return editPlan(deps, user, venueId, ifMatch, 'strips added', (tx, { venue }) => {
    const r = planRepository(tx);
    const existing = r.stripsOf(venueId);
    const prefix = input.prefix ?? 'Strip ';
    const startAt = input.startAt ?? existing.length + 1;
    const labels = input.labels ?? Array.from({ length: input.count! }, (_, i) => `${prefix}${startAt + i}`.trim());
    const taken = labels.filter((l) => existing.some((s) => s.label === l));
    if (taken.length) {
      throw conflict(
        'duplicate-strip-label',
        `This venue already has ${taken.slice(0, 5).join(', ')}${taken.length > 5 ? ' …' : ''}; choose other labels or another start number.`,
        {
          errors: [{ path: input.labels ? 'labels' : 'startAt', message: `Already used: ${taken.join(', ')}` }],
        },
      );
    }
    const profile = profileOf(tx, venue.profileId);
    const template = input.template ?? DEFAULT_POSITION_TEMPLATE;
    let sort = r.maxStripSort(venueId);
    for (const label of labels) {
      const stripId = newId();
      sort += 1;
      r.insertStrip({
        id: stripId,
        venueId,
        label,
        sortOrder: sort,
        zone: input.zone ?? null,
        conductivePiste: input.conductivePiste ?? false,
      });
      template.filter((p) => !p.pisteOnly || input.conductivePiste).forEach((p, i) => insertPosition(tx, stripId, p, i + 1, profile));
      recordAudit(tx, user, 'strip.created', 'strip', stripId, {
        venueId,
        label,
        zone: input.zone ?? null,
        conductivePiste: !!input.conductivePiste,
      });
    }
  });
}

/** Who tests the venue, in the edit's transaction: active technicians of the organisation only. */
function applyTechnicians(tx: Tx, user: AuthUser, venueId: string, userIds: string[], field: string) {
  const r = planRepository(tx);
  const people = r.usersByIds(userIds);
  const invalid = userIds.filter((id) => {
    const p = people.find((x) => x.id === id);
    return !p || p.orgId !== user.orgId || p.role !== 'technician' || p.disabled;
  });
  if (invalid.length) {
    throw unprocessable('not-a-technician', 'Only active technicians of your organisation can be assigned to a venue.', {
      errors: invalid.map((id) => ({
        path: `${field}.${userIds.indexOf(id)}`,
        message: 'Not an active technician of your organisation.',
      })),
    });
  }
  const before = r.techniciansOf(venueId);
  const same = before.length === userIds.length && before.every((b) => userIds.includes(b.id));
  if (same && field === 'technicianIds') return; // unchanged in the venue form: nothing to write
  r.setTechnicians(venueId, userIds);
  recordAudit(tx, user, 'venue.technicians-set', 'venue', venueId, {
    venueId,
    added: people.filter((p) => !before.some((b) => b.id === p.id)).map((p) => p.name),
    removed: before.filter((b) => !userIds.includes(b.id)).map((b) => b.name),
  });
}

function setTechnicians(deps: AppDeps, user: AuthUser, venueId: string, ifMatch: string | undefined, userIds: string[]) {
  return editPlan(deps, user, venueId, ifMatch, 'technicians', (tx) => applyTechnicians(tx, user, venueId, userIds, 'userIds'));
}

export function venuePlanService(deps: AppDeps) {
  return {
    plan: (user: AuthUser, venueId: string) => readPlan(deps.db, user, venueId),
    createVenue: (user: AuthUser, eventId: string, input: CreateVenueInput) => createVenue(deps, user, eventId, input),
    updateVenue: (user: AuthUser, venueId: string, ifMatch: string | undefined, input: UpdateVenueInput) =>
      updateVenue(deps, user, venueId, ifMatch, input),
    addStrips: (user: AuthUser, venueId: string, ifMatch: string | undefined, input: BulkStripsInput) =>
      addStrips(deps, user, venueId, ifMatch, input),
    setTechnicians: (user: AuthUser, venueId: string, ifMatch: string | undefined, userIds: string[]) =>
      setTechnicians(deps, user, venueId, ifMatch, userIds),
  };
}
