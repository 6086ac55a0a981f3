// Events, venues and the venue plan (strips, positions, attached items, steps, technicians).
// Every plan edit checks the venue's version (If-Match), bumps it, re-opens a signed-off venue and
// is audited, all in one transaction.
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import type { Tx } from '../db/client';
import { planRepository } from '../db/plan.repository';
import { profilesRepository } from '../db/profiles.repository';
import { equipmentRepository } from '../db/equipment.repository';
import { recordAudit } from '../db/audit.repository';
import { accessService } from './access.service';
import { reopenIfSignedOff } from './venue-lifecycle';
import { toLimitProfile } from '../presenters/profiles';
import { conflict, forbidden, notFound, unprocessable } from '../lib/app-error';
import { newId, nowIso } from '../lib/ids';
import { requireVersion } from '../http/etag';
import { DEFAULT_POSITION_TEMPLATE, stepsForKind, type PositionTemplateEntry } from '../../shared/domain/checklist';
import { findRule, type EquipmentKind, type LimitProfile } from '../../shared/domain/limits';
import { EQUIPMENT_KIND_LABELS } from '../../shared/schemas/equipment';
import type {
  AddPositionValues,
  AddStepInput,
  BulkStripsInput,
  CreateEventInput,
  CreateVenueInput,
  UpdateStripInput,
  UpdateVenueInput,
} from '../../shared/schemas/plan';

type VenueCtx = ReturnType<ReturnType<typeof accessService>['requireVenue']>;

const staleMessage = (yours: number | null, current: number) =>
  `Someone else changed the plan meanwhile: you were editing version ${yours ?? '?'}, the plan is now at version ${current}. Reload the plan to see their changes, then apply yours again.`;

export function planService(deps: AppDeps) {
  const access = accessService(deps.db);
  const repo = planRepository(deps.db);

  function profileOf(tx: Tx, profileId: string): LimitProfile {
    return toLimitProfile(profilesRepository(tx).findById(profileId)!);
  }

  /** Adds a position with its checklist steps from the kind and the profile. */
  function addPosition(tx: Tx, stripId: string, entry: PositionTemplateEntry, sortOrder: number, profile: LimitProfile) {
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
  function attachableItem(
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
      throw conflict('item-in-use', `${assetTag} is already on ${elsewhere.stripLabel} (${elsewhere.positionName}) in this venue; take it off there first.`, {
        errors: [{ path: 'assetTag', message: `Already on ${elsewhere.stripLabel}, ${elsewhere.positionName}.` }],
      });
    }
    return { item, here: !!elsewhere };
  }

  /**
   * One plan edit: object-level access, the If-Match check, the change, the version bump and the
   * re-opening of a signed-off venue, in one transaction. Answers the new plan.
   */
  function edit(user: AuthUser, venueId: string, ifMatch: string | undefined, reason: string, change: (tx: Tx, ctx: VenueCtx) => void) {
    deps.db.transaction((tx) => {
      const ctx = accessService(tx).requireVenue(user, venueId, 'plan');
      requireVersion(ifMatch, ctx.venue.version, staleMessage);
      change(tx, ctx);
      planRepository(tx).bumpVersion(venueId);
      reopenIfSignedOff(tx, { venueId, orgId: user.orgId, actorId: user.id, reason: `Plan changed: ${reason}` });
    });
    return plan(user, venueId);
  }

  function plan(user: AuthUser, venueId: string) {
    const { venue, event } = access.requireVenue(user, venueId, 'read');
    const profileRow = profilesRepository(deps.db).findById(venue.profileId)!;
    const latest = profilesRepository(deps.db).latestOf(profileRow.lineageId)!;
    const stepsByPosition = new Map<string, ReturnType<typeof repo.stepsOfVenue>>();
    for (const s of repo.stepsOfVenue(venueId)) stepsByPosition.set(s.positionId, [...(stepsByPosition.get(s.positionId) ?? []), s]);
    const positionsByStrip = new Map<string, unknown[]>();
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
          ? { id: equipment.id, assetTag: equipment.assetTag, kind: equipment.kind, lengthM: equipment.lengthM, status: equipment.status, description: equipment.description }
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

  function requireProfileOfOrg(user: AuthUser, profileId: string, tx?: Tx) {
    const row = profilesRepository(tx ?? deps.db).findById(profileId);
    if (!row || row.orgId !== user.orgId) {
      throw unprocessable('no-such-profile', 'That limit profile is not in your library.', {
        errors: [{ path: 'profileId', message: 'Choose a limit profile from your library.' }],
      });
    }
    return row;
  }

  /** Loop steps follow the profile's loopRequired: added where it now asks, dropped where it no longer does. */
  function syncLoopSteps(tx: Tx, venueId: string, profile: LimitProfile, at: string) {
    const r = planRepository(tx);
    const want = new Set(profile.loopRequired ?? []);
    for (const { position } of r.positionsOfVenue(venueId)) {
      const active = r.activeStepsOf(position.id);
      const loops = active.filter((s) => s.testKind === 'loop');
      if (want.has(position.equipmentKind) && loops.length === 0) {
        r.insertStep({ id: newId(), positionId: position.id, testKind: 'loop', conductors: 'A-B', sortOrder: r.maxStepSort(position.id) + 1 });
      } else if (!want.has(position.equipmentKind)) {
        for (const s of loops) if (!s.addedByDirector) r.removeStep(s.id, at);
      }
    }
  }

  function requireStripOfPlan(user: AuthUser, stripId: string) {
    const strip = repo.findStrip(stripId);
    if (!strip) throw notFound('That strip');
    return strip;
  }

  return {
    plan,

    /** Who a director can choose from: technicians for venues, organisers for events. */
    people(user: AuthUser) {
      const all = repo.activePeopleOfOrg(user.orgId);
      return { technicians: all.filter((p) => p.role === 'technician'), organisers: all.filter((p) => p.role === 'organiser') };
    },

    // ---------- events ----------
    listEvents(user: AuthUser) {
      const list = user.role === 'technician' ? repo.eventsWithVenueOf(user.id) : repo.eventsOfOrg(user.orgId);
      return list.map((e) => {
        const venues = repo.venuesOfEvent(e.id).filter((v) => user.role !== 'technician' || access.canSee(user, v.id));
        return { ...e, venues: venues.map((v) => ({ id: v.id, name: v.name, status: v.status })) };
      });
    },

    createEvent(user: AuthUser, input: CreateEventInput) {
      if (input.organiserId) {
        const organiser = repo.findUser(input.organiserId);
        if (!organiser || organiser.orgId !== user.orgId || organiser.role !== 'organiser') {
          throw unprocessable('no-such-organiser', 'The organiser must be someone in your organisation with the organiser role.', {
            errors: [{ path: 'organiserId', message: 'Choose an organiser of your organisation.' }],
          });
        }
      }
      const id = newId();
      deps.db.transaction((tx) => {
        planRepository(tx).insertEvent({
          id,
          orgId: user.orgId,
          name: input.name,
          startsOn: input.startsOn,
          endsOn: input.endsOn,
          directorId: user.id,
          organiserId: input.organiserId ?? null,
        });
        recordAudit(tx, user, 'event.created', 'event', id, { name: input.name, startsOn: input.startsOn, endsOn: input.endsOn });
      });
      return this.getEvent(user, id);
    },

    getEvent(user: AuthUser, id: string) {
      const event = repo.findEvent(id);
      if (!event || event.orgId !== user.orgId) throw notFound('That event');
      const venues = repo.venuesOfEvent(id).filter((v) => access.canSee(user, v.id));
      if (user.role === 'technician' && venues.length === 0) throw forbidden('You are not assigned to a venue of this event.');
      const people = repo.usersByIds([event.directorId, event.organiserId].filter((x): x is string => !!x));
      const nameOf = (uid: string | null) => people.find((p) => p.id === uid)?.name ?? null;
      return {
        ...event,
        directorName: nameOf(event.directorId),
        organiserName: nameOf(event.organiserId),
        venues: venues.map((v) => ({ id: v.id, name: v.name, status: v.status, profileId: v.profileId, clonedFromId: v.clonedFromId, stripCount: repo.stripsOf(v.id).length })),
      };
    },

    /** A new venue of an event, empty or cloned from an earlier venue (strips, positions, steps; no readings). */
    createVenue(user: AuthUser, eventId: string, input: CreateVenueInput) {
      const event = repo.findEvent(eventId);
      if (!event || event.orgId !== user.orgId) throw notFound('That event');
      const profileRow = requireProfileOfOrg(user, input.profileId);
      const source = input.cloneFromVenueId ? access.requireVenue(user, input.cloneFromVenueId, 'read') : null;
      const venueId = newId();
      deps.db.transaction((tx) => {
        const r = planRepository(tx);
        const eq = equipmentRepository(tx);
        const at = nowIso();
        r.insertVenue({ id: venueId, eventId, name: input.name, profileId: profileRow.id, clonedFromId: source?.venue.id ?? null });
        const copied = { strips: 0, positions: 0, steps: 0, items: 0, technicians: 0 };
        if (source) {
          const srcSteps = r.stepsOfVenue(source.venue.id).filter((s) => !s.removedAt);
          const srcPositions = r.positionsOfVenue(source.venue.id);
          for (const s of r.stripsOf(source.venue.id)) {
            const stripId = newId();
            r.insertStrip({ id: stripId, venueId, label: s.label, sortOrder: s.sortOrder, zone: s.zone, conductivePiste: s.conductivePiste });
            copied.strips += 1;
            for (const { position, equipment } of srcPositions.filter((p) => p.position.stripId === s.id)) {
              const positionId = newId();
              r.insertPosition({ id: positionId, stripId, name: position.name, equipmentKind: position.equipmentKind, sortOrder: position.sortOrder });
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
          // The checklist follows the new venue's profile (loop steps where it asks for them).
          syncLoopSteps(tx, venueId, toLimitProfile(profileRow), at);
        }
        recordAudit(tx, user, source ? 'venue.cloned' : 'venue.created', 'venue', venueId, {
          name: input.name,
          eventId,
          profileId: profileRow.id,
          ...(source ? { fromVenueId: source.venue.id, fromVenueName: source.venue.name, copied } : {}),
        });
      });
      return plan(user, venueId);
    },

    // ---------- the venue ----------
    updateVenue(user: AuthUser, venueId: string, ifMatch: string | undefined, input: UpdateVenueInput) {
      return edit(user, venueId, ifMatch, 'venue details', (tx, { venue }) => {
        const patch: { name?: string; profileId?: string } = {};
        if (input.name !== undefined && input.name !== venue.name) patch.name = input.name;
        if (input.profileId !== undefined && input.profileId !== venue.profileId) {
          const row = requireProfileOfOrg(user, input.profileId, tx);
          patch.profileId = row.id;
          syncLoopSteps(tx, venueId, toLimitProfile(row), nowIso());
        }
        // Saving the details unchanged is not an error; there is just nothing to write.
        if (Object.keys(patch).length === 0) return;
        planRepository(tx).updateVenue(venueId, patch);
        recordAudit(tx, user, 'venue.updated', 'venue', venueId, {
          venueId,
          changed: Object.fromEntries(Object.entries(patch).map(([k, v]) => [k, { from: venue[k as keyof typeof venue], to: v }])),
        });
      });
    },

    addStrips(user: AuthUser, venueId: string, ifMatch: string | undefined, input: BulkStripsInput) {
      return edit(user, venueId, ifMatch, 'strips added', (tx, { venue }) => {
        const r = planRepository(tx);
        const existing = r.stripsOf(venueId);
        const prefix = input.prefix ?? 'Strip ';
        const startAt = input.startAt ?? existing.length + 1;
        const labels = input.labels ?? Array.from({ length: input.count! }, (_, i) => `${prefix}${startAt + i}`.trim());
        const taken = labels.filter((l) => existing.some((s) => s.label === l));
        if (taken.length) {
          throw conflict('duplicate-strip-label', `This venue already has ${taken.slice(0, 5).join(', ')}${taken.length > 5 ? ' …' : ''}; choose other labels or another start number.`, {
            errors: [{ path: input.labels ? 'labels' : 'startAt', message: `Already used: ${taken.join(', ')}` }],
          });
        }
        const profile = profileOf(tx, venue.profileId);
        const template = input.template ?? DEFAULT_POSITION_TEMPLATE;
        let sort = r.maxStripSort(venueId);
        for (const label of labels) {
          const stripId = newId();
          sort += 1;
          r.insertStrip({ id: stripId, venueId, label, sortOrder: sort, zone: input.zone ?? null, conductivePiste: input.conductivePiste ?? false });
          template
            .filter((p) => !p.pisteOnly || input.conductivePiste)
            .forEach((p, i) => addPosition(tx, stripId, p, i + 1, profile));
          recordAudit(tx, user, 'strip.created', 'strip', stripId, { venueId, label, zone: input.zone ?? null, conductivePiste: !!input.conductivePiste });
        }
      });
    },

    updateStrip(user: AuthUser, stripId: string, ifMatch: string | undefined, input: UpdateStripInput) {
      const strip = requireStripOfPlan(user, stripId);
      return edit(user, strip.venueId, ifMatch, `strip ${strip.label} changed`, (tx, { venue }) => {
        const r = planRepository(tx);
        if (input.label !== undefined && input.label !== strip.label && r.stripByLabel(strip.venueId, input.label)) {
          throw conflict('duplicate-strip-label', `This venue already has a strip called ${input.label}.`, {
            errors: [{ path: 'label', message: `${input.label} is already used in this venue.` }],
          });
        }
        const patch = Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined)) as UpdateStripInput;
        r.updateStrip(stripId, patch);
        if (input.conductivePiste !== undefined && input.conductivePiste !== strip.conductivePiste) {
          const pistes = r.positionsOfStrip(stripId).filter((p) => p.equipmentKind === 'piste');
          if (input.conductivePiste && pistes.length === 0) {
            const entry = DEFAULT_POSITION_TEMPLATE.find((p) => p.equipmentKind === 'piste')!;
            addPosition(tx, stripId, entry, r.positionsOfStrip(stripId).length + 1, profileOf(tx, venue.profileId));
          } else if (input.conductivePiste) {
            // Bring back the piste's steps that were dropped when it was last made non-conductive.
            const profile = profileOf(tx, venue.profileId);
            for (const p of pistes) {
              if (r.activeStepsOf(p.id).length > 0) continue;
              stepsForKind('piste', profile).forEach((s) =>
                r.insertStep({ id: newId(), positionId: p.id, testKind: s.testKind, conductors: s.conductors, sortOrder: r.maxStepSort(p.id) + 1 }),
              );
            }
          } else {
            const at = nowIso();
            for (const p of pistes) for (const s of r.activeStepsOf(p.id)) r.removeStep(s.id, at);
          }
        }
        recordAudit(tx, user, 'strip.updated', 'strip', stripId, {
          venueId: strip.venueId,
          label: input.label ?? strip.label,
          changed: Object.fromEntries(Object.entries(patch).map(([k, v]) => [k, { from: strip[k as keyof typeof strip], to: v }])),
        });
      });
    },

    withdrawStrip(user: AuthUser, stripId: string, ifMatch: string | undefined, reason: string) {
      const strip = requireStripOfPlan(user, stripId);
      return edit(user, strip.venueId, ifMatch, `strip ${strip.label} withdrawn`, (tx) => {
        if (strip.withdrawnAt) throw conflict('already-withdrawn', `${strip.label} is already withdrawn (${strip.withdrawnReason}).`);
        planRepository(tx).updateStrip(stripId, { withdrawnReason: reason, withdrawnAt: nowIso() });
        recordAudit(tx, user, 'strip.withdrawn', 'strip', stripId, { venueId: strip.venueId, label: strip.label, reason });
      });
    },

    reinstateStrip(user: AuthUser, stripId: string, ifMatch: string | undefined) {
      const strip = requireStripOfPlan(user, stripId);
      return edit(user, strip.venueId, ifMatch, `strip ${strip.label} reinstated`, (tx) => {
        if (!strip.withdrawnAt) throw conflict('not-withdrawn', `${strip.label} is not withdrawn.`);
        planRepository(tx).updateStrip(stripId, { withdrawnReason: null, withdrawnAt: null });
        recordAudit(tx, user, 'strip.reinstated', 'strip', stripId, { venueId: strip.venueId, label: strip.label, previousReason: strip.withdrawnReason });
      });
    },

    /** Attach a register item to a position by its asset tag, or take it off (null). */
    attachEquipment(user: AuthUser, positionId: string, ifMatch: string | undefined, assetTag: string | null) {
      const found = repo.findPosition(positionId);
      if (!found) throw notFound('That position');
      const { position, strip } = found;
      return edit(user, strip.venueId, ifMatch, `${strip.label} ${position.name} equipment`, (tx) => {
        const eq = equipmentRepository(tx);
        const before = position.equipmentId ? eq.findById(position.equipmentId) : null;
        let item = null;
        if (assetTag !== null) {
          const found = attachableItem(tx, user, { positionId, name: position.name, equipmentKind: position.equipmentKind, venueId: strip.venueId }, assetTag);
          if (found.here) return; // already there: nothing changes, but the version still moves on
          item = found.item;
        } else if (!position.equipmentId) {
          return;
        }
        eq.assignToPosition(positionId, item?.id ?? null, user.id, nowIso());
        recordAudit(tx, user, item ? 'position.equipment-attached' : 'position.equipment-removed', 'position', positionId, {
          venueId: strip.venueId,
          strip: strip.label,
          position: position.name,
          assetTag: item?.assetTag ?? null,
          previousAssetTag: before?.assetTag ?? null,
        });
      });
    },

    /** A position added to one strip by hand: it goes last, gets its kind's steps and, with a tag, its item. */
    addPosition(user: AuthUser, stripId: string, ifMatch: string | undefined, input: AddPositionValues) {
      const strip = requireStripOfPlan(user, stripId);
      return edit(user, strip.venueId, ifMatch, `${strip.label} position ${input.name} added`, (tx, { venue }) => {
        if (strip.withdrawnAt) {
          throw conflict('strip-withdrawn', `${strip.label} is withdrawn (${strip.withdrawnReason}); reinstate it before adding positions to it.`);
        }
        const r = planRepository(tx);
        const name = input.name.trim();
        const taken = r.positionsOfStrip(stripId).find((p) => p.name.trim().toLowerCase() === name.toLowerCase());
        if (taken) {
          throw conflict('duplicate-position-name', `${strip.label} already has a position called ${taken.name}.`, {
            errors: [{ path: 'name', message: `${taken.name} is already on ${strip.label}; choose another name.` }],
          });
        }
        const assetTag = input.assetTag ?? null;
        const item = assetTag ? attachableItem(tx, user, { positionId: null, name, equipmentKind: input.equipmentKind, venueId: strip.venueId }, assetTag).item : null;
        const profile = profileOf(tx, venue.profileId);
        const positionId = addPosition(tx, stripId, { name, equipmentKind: input.equipmentKind }, r.maxPositionSort(stripId) + 1, profile);
        if (item) equipmentRepository(tx).assignToPosition(positionId, item.id, user.id, nowIso());
        recordAudit(tx, user, 'position.added', 'position', positionId, {
          venueId: strip.venueId,
          strip: strip.label,
          position: name,
          equipmentKind: input.equipmentKind,
          assetTag: item?.assetTag ?? null,
          steps: r.activeStepsOf(positionId).map((s) => `${s.testKind} ${s.conductors}`),
        });
      });
    },

    /**
     * Takes a position off a strip, with its steps, only while nothing was recorded against it:
     * readings and faults are kept, so a tested position stays and its steps are dropped instead.
     */
    removePosition(user: AuthUser, positionId: string, ifMatch: string | undefined) {
      const found = repo.findPosition(positionId);
      if (!found) throw notFound('That position');
      const { position, strip } = found;
      return edit(user, strip.venueId, ifMatch, `${strip.label} position ${position.name} removed`, (tx) => {
        const r = planRepository(tx);
        const records = r.recordsOfPosition(positionId);
        if (records.readings > 0 || records.faults > 0) {
          const what = [
            records.readings > 0 ? `${records.readings} reading${records.readings === 1 ? '' : 's'}` : null,
            records.faults > 0 ? `${records.faults} fault record${records.faults === 1 ? '' : 's'}` : null,
          ]
            .filter(Boolean)
            .join(' and ');
          throw conflict(
            'position-has-readings',
            `${position.name} on ${strip.label} has ${what}, which are kept, so the position cannot be removed. Take its steps off the checklist instead: they will no longer be asked for, and what was recorded stays on file.`,
            { readings: records.readings, faults: records.faults },
          );
        }
        const steps = r.stepsOfPosition(positionId);
        const placements = r.assignmentsOfPosition(positionId);
        r.deletePosition(positionId);
        // The placement rows go with the position; the audit keeps which items sat there and when.
        recordAudit(tx, user, 'position.removed', 'position', positionId, {
          venueId: strip.venueId,
          strip: strip.label,
          position: position.name,
          equipmentKind: position.equipmentKind,
          assetTag: placements.find((p) => !p.removedAt)?.assetTag ?? null,
          placements,
          steps: steps.map((s) => `${s.testKind} ${s.conductors}${s.removedAt ? ' (dropped)' : ''}`),
        });
      });
    },

    setTechnicians(user: AuthUser, venueId: string, ifMatch: string | undefined, userIds: string[]) {
      return edit(user, venueId, ifMatch, 'technicians', (tx) => {
        const r = planRepository(tx);
        const people = r.usersByIds(userIds);
        const invalid = userIds.filter((id) => {
          const p = people.find((x) => x.id === id);
          return !p || p.orgId !== user.orgId || p.role !== 'technician' || p.disabled;
        });
        if (invalid.length) {
          throw unprocessable('not-a-technician', 'Only active technicians of your organisation can be assigned to a venue.', {
            errors: invalid.map((id) => ({ path: `userIds.${userIds.indexOf(id)}`, message: 'Not an active technician of your organisation.' })),
          });
        }
        const before = r.techniciansOf(venueId);
        r.setTechnicians(venueId, userIds);
        recordAudit(tx, user, 'venue.technicians-set', 'venue', venueId, {
          venueId,
          added: people.filter((p) => !before.some((b) => b.id === p.id)).map((p) => p.name),
          removed: before.filter((b) => !userIds.includes(b.id)).map((b) => b.name),
        });
      });
    },

    addStep(user: AuthUser, positionId: string, ifMatch: string | undefined, input: AddStepInput) {
      const found = repo.findPosition(positionId);
      if (!found) throw notFound('That position');
      const { position, strip } = found;
      return edit(user, strip.venueId, ifMatch, `${strip.label} ${position.name} step added`, (tx, { venue }) => {
        const r = planRepository(tx);
        const profile = profileOf(tx, venue.profileId);
        if (!findRule(profile, position.equipmentKind as EquipmentKind, input.testKind)) {
          throw unprocessable(
            'no-limit-rule',
            `The limit profile “${profile.name}” (version ${profile.version}) has no ${input.testKind} rule for a ${EQUIPMENT_KIND_LABELS[position.equipmentKind].toLowerCase()}, so this step could not be judged; add a rule to the profile first.`,
            { errors: [{ path: 'testKind', message: `No ${input.testKind} rule for ${position.equipmentKind} in the profile.` }] },
          );
        }
        if (r.activeStepsOf(positionId).some((s) => s.testKind === input.testKind && s.conductors === input.conductors)) {
          throw conflict('duplicate-step', `${position.name} on ${strip.label} already has a ${input.testKind} step for ${input.conductors}.`);
        }
        const stepId = newId();
        r.insertStep({
          id: stepId,
          positionId,
          testKind: input.testKind,
          conductors: input.conductors,
          sortOrder: r.maxStepSort(positionId) + 1,
          required: input.required ?? true,
          addedByDirector: true,
        });
        recordAudit(tx, user, 'step.added', 'step', stepId, {
          venueId: strip.venueId,
          strip: strip.label,
          position: position.name,
          testKind: input.testKind,
          conductors: input.conductors,
          required: input.required ?? true,
        });
      });
    },

    /** Drops a step from the checklist; it stays stored because readings point at it. */
    dropStep(user: AuthUser, stepId: string, ifMatch: string | undefined) {
      const found = repo.findStep(stepId);
      if (!found) throw notFound('That step');
      const { step, position, strip } = found;
      return edit(user, strip.venueId, ifMatch, `${strip.label} ${position.name} step dropped`, (tx) => {
        if (step.removedAt) throw conflict('already-dropped', 'That step was already dropped from the checklist.');
        planRepository(tx).removeStep(stepId, nowIso());
        recordAudit(tx, user, 'step.dropped', 'step', stepId, {
          venueId: strip.venueId,
          strip: strip.label,
          position: position.name,
          testKind: step.testKind,
          conductors: step.conductors,
        });
      });
    },
  };
}
