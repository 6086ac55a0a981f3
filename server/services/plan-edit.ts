// What the plan services (venue plan, strip plan) share: reading the plan, the one way an edit is
// made (access, If-Match, the change, the version bump, re-opening a signed-off venue, all in one
// transaction), and the checks of a position, its steps and the item put in it.
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import type { Db, Tx } from '../db/client';
import { planRepository } from '../db/plan.repository';
import { profilesRepository } from '../db/profiles.repository';
import { equipmentRepository } from '../db/equipment.repository';
import { accessService } from './access.service';
import { reopenIfSignedOff } from './venue-lifecycle';
import { toLimitProfile } from '../presenters/profiles';
import { conflict, notFound, unprocessable } from '../lib/app-error';
import { newId } from '../lib/ids';
import { requireVersion } from '../http/etag';
import { stepsForKind, type PositionTemplateEntry } from '../../shared/domain/checklist';
import type { EquipmentKind, LimitProfile } from '../../shared/domain/limits';
import { EQUIPMENT_KIND_LABELS } from '../../shared/schemas/equipment';
import type { VenuePlan } from '../../shared/contracts/plan';

export type VenueCtx = ReturnType<ReturnType<typeof accessService>['requireVenue']>;

const staleMessage = (yours: number | null, current: number) =>
  `Someone else changed the plan meanwhile: you were editing version ${yours ?? '?'}, the plan is now at version ${current}. Reload the plan to see their changes, then apply yours again.`;

/** The venue's plan as the planning screen shows it: strips, positions, items and steps. */
export function readPlan(db: Db, user: AuthUser, venueId: string): VenuePlan {
  const repo = planRepository(db);
  const { venue, event } = accessService(db).requireVenue(user, venueId, 'read');
  const profileRow = profilesRepository(db).findById(venue.profileId)!;
  const latest = profilesRepository(db).latestOf(profileRow.lineageId)!;
  const stepsByPosition = new Map<string, ReturnType<typeof repo.stepsOfVenue>>();
  for (const s of repo.stepsOfVenue(venueId)) stepsByPosition.set(s.positionId, [...(stepsByPosition.get(s.positionId) ?? []), s]);
  const positionsByStrip = new Map<string, VenuePlan['strips'][number]['positions']>();
  const tested = repo.testedPositionsOfVenue(venueId);
  for (const { position, equipment } of repo.positionsOfVenue(venueId)) {
    const list = positionsByStrip.get(position.stripId) ?? [];
    list.push({
      id: position.id,
      name: position.name,
      equipmentKind: position.equipmentKind,
      sortOrder: position.sortOrder,
      // A reading or a fault was recorded against it, so it stays in the plan (steps can be dropped).
      tested: tested.has(position.id),
      equipment: equipment
        ? {
            id: equipment.id,
            assetTag: equipment.assetTag,
            kind: equipment.kind,
            lengthM: equipment.lengthM,
            status: equipment.status,
            description: equipment.description,
          }
        : null,
      steps: (stepsByPosition.get(position.id) ?? []).map((s) => ({
        id: s.id,
        testKind: s.testKind,
        conductors: s.conductors,
        sortOrder: s.sortOrder,
        required: s.required,
        addedByDirector: s.addedByDirector,
        removedAt: s.removedAt,
      })),
    });
    positionsByStrip.set(position.stripId, list);
  }
  return {
    venue: {
      id: venue.id,
      name: venue.name,
      status: venue.status,
      version: venue.version,
      profileId: venue.profileId,
      clonedFromId: venue.clonedFromId,
      eventId: venue.eventId,
      timeZone: venue.timeZone,
    },
    event: { id: event.id, name: event.name, startsOn: event.startsOn, endsOn: event.endsOn, directorId: event.directorId },
    profile: {
      id: profileRow.id,
      lineageId: profileRow.lineageId,
      name: profileRow.name,
      version: profileRow.version,
      latestId: latest.id,
      latestVersion: latest.version,
      loopRequired: toLimitProfile(profileRow).loopRequired ?? [],
    },
    technicians: repo.techniciansOf(venueId),
    strips: repo.stripsOf(venueId).map((s) => ({
      id: s.id,
      label: s.label,
      zone: s.zone,
      sortOrder: s.sortOrder,
      conductivePiste: s.conductivePiste,
      withdrawnReason: s.withdrawnReason,
      withdrawnAt: s.withdrawnAt,
      positions: positionsByStrip.get(s.id) ?? [],
    })),
  };
}

/**
 * One plan edit: object-level access, the If-Match check, the change, the version bump and the
 * re-opening of a signed-off venue, in one transaction. Answers the new plan.
 */
export function editPlan(
  deps: AppDeps,
  user: AuthUser,
  venueId: string,
  ifMatch: string | undefined,
  reason: string,
  change: (tx: Tx, ctx: VenueCtx) => void,
): VenuePlan {
  deps.db.transaction((tx) => {
    const ctx = accessService(tx).requireVenue(user, venueId, 'plan');
    requireVersion(ifMatch, ctx.venue.version, staleMessage);
    change(tx, ctx);
    planRepository(tx).bumpVersion(venueId);
    reopenIfSignedOff(tx, { venueId, orgId: user.orgId, actorId: user.id, reason: `Plan changed: ${reason}` });
  });
  return readPlan(deps.db, user, venueId);
}

export function profileOf(tx: Tx, profileId: string): LimitProfile {
  return toLimitProfile(profilesRepository(tx).findById(profileId)!);
}

/** Adds a position with its checklist steps from the kind and the profile. */
export function insertPosition(tx: Tx, stripId: string, entry: PositionTemplateEntry, sortOrder: number, profile: LimitProfile) {
  const r = planRepository(tx);
  const positionId = newId();
  r.insertPosition({ id: positionId, stripId, name: entry.name, equipmentKind: entry.equipmentKind, sortOrder });
  stepsForKind(entry.equipmentKind, profile).forEach((s, k) =>
    r.insertStep({ id: newId(), positionId, testKind: s.testKind, conductors: s.conductors, sortOrder: k + 1 }),
  );
  return positionId;
}

/**
 * The register item a position may take, by asset tag: of the user's organisation, of the
 * position's kind, not retired, and not in another position of the venue. `here` says it already
 * sits in this very position. Shared by attaching to a position and adding one with an item.
 */
export function attachableItem(
  tx: Tx,
  user: AuthUser,
  target: { positionId: string | null; name: string; equipmentKind: EquipmentKind; venueId: string },
  assetTag: string,
) {
  const eq = equipmentRepository(tx);
  const item = eq.findByTag(user.orgId, assetTag);
  const bad = (message: string) => unprocessable('cannot-attach', message, { errors: [{ path: 'assetTag', message }] });
  if (!item) throw bad(`There is no item with the asset tag ${assetTag} in the register.`);
  if (item.kind !== target.equipmentKind) {
    throw bad(
      `${assetTag} is a ${EQUIPMENT_KIND_LABELS[item.kind].toLowerCase()}, but ${target.name} takes a ${EQUIPMENT_KIND_LABELS[target.equipmentKind].toLowerCase()}.`,
    );
  }
  if (item.status === 'retired') throw bad(`${assetTag} is retired and cannot go back on a strip.`);
  const elsewhere = eq.positionInVenue(item.id, target.venueId);
  if (elsewhere && elsewhere.positionId !== target.positionId) {
    throw conflict(
      'item-in-use',
      `${assetTag} is already on ${elsewhere.stripLabel} (${elsewhere.positionName}) in this venue; take it off there first.`,
      {
        errors: [{ path: 'assetTag', message: `Already on ${elsewhere.stripLabel}, ${elsewhere.positionName}.` }],
      },
    );
  }
  return { item, here: !!elsewhere };
}

/** The limit profile a venue is given: one of the user's organisation, else 422. */
export function requireProfileOfOrg(db: Db | Tx, user: AuthUser, profileId: string) {
  const row = profilesRepository(db).findById(profileId);
  if (!row || row.orgId !== user.orgId) {
    throw unprocessable('no-such-profile', 'That limit profile is not in your library.', {
      errors: [{ path: 'profileId', message: 'Choose a limit profile from your library.' }],
    });
  }
  return row;
}

/** Loop steps follow the profile's loopRequired: added where it now asks, dropped where it no longer does. */
export function syncLoopSteps(tx: Tx, venueId: string, profile: LimitProfile, at: string) {
  const r = planRepository(tx);
  const want = new Set(profile.loopRequired ?? []);
  for (const { position } of r.positionsOfVenue(venueId)) {
    const active = r.activeStepsOf(position.id);
    const loops = active.filter((s) => s.testKind === 'loop');
    if (want.has(position.equipmentKind) && loops.length === 0) {
      r.insertStep({
        id: newId(),
        positionId: position.id,
        testKind: 'loop',
        conductors: 'A-B',
        sortOrder: r.maxStepSort(position.id) + 1,
      });
    } else if (!want.has(position.equipmentKind)) {
      for (const s of loops) if (!s.addedByDirector) r.removeStep(s.id, at);
    }
  }
}

// The spare pool is kept by the spares page (PUT /venues/:id/spares), never edited as a strip of the plan.
const poolRefused = () => conflict('spare-pool', 'This is the venue’s spare pool, not a strip of the plan: change it on the spares page.');

// The caller's access to the venue is checked before the pool is named: another organisation's
// strip answers 404 whatever it is.
export function requireStrip(db: Db, user: AuthUser, stripId: string) {
  const strip = planRepository(db).findStrip(stripId);
  if (!strip) throw notFound('That strip');
  accessService(db).requireVenue(user, strip.venueId, 'read');
  if (strip.sparePool) throw poolRefused();
  return strip;
}

export function requirePosition(db: Db, user: AuthUser, positionId: string) {
  const found = planRepository(db).findPosition(positionId);
  if (!found) throw notFound('That position');
  accessService(db).requireVenue(user, found.strip.venueId, 'read');
  if (found.strip.sparePool) throw poolRefused();
  return found;
}
