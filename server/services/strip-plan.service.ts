// A strip's part of the plan: its details, withdrawing and reinstating it, its positions (added,
// removed, the item put in them) and their checklist steps (added, dropped).
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import { planRepository } from '../db/plan.repository';
import { equipmentRepository } from '../db/equipment.repository';
import { recordAudit } from '../db/audit.repository';
import { attachableItem, editPlan, insertPosition, profileOf, requirePosition, requireStrip } from './plan-edit';
import { applyAssetTags } from './asset-tags.service';
import { conflict, notFound, unprocessable } from '../lib/app-error';
import { newId, nowIso } from '../lib/ids';
import { DEFAULT_POSITION_TEMPLATE, stepsForKind } from '../../shared/domain/checklist';
import { findRule, type EquipmentKind } from '../../shared/domain/limits';
import { EQUIPMENT_KIND_LABELS } from '../../shared/schemas/equipment';
import type { AddPositionValues, AddStepInput, UpdateStripValues } from '../../shared/schemas/plan';

function updateStrip(deps: AppDeps, user: AuthUser, stripId: string, ifMatch: string | undefined, body: UpdateStripValues) {
  const strip = requireStrip(deps.db, user, stripId);
  const { assetTags, ...input } = body;
  return editPlan(deps, user, strip.venueId, ifMatch, `strip ${strip.label} changed`, (tx, { venue }) => {
    const r = planRepository(tx);
    if (input.label !== undefined && input.label !== strip.label && r.stripByLabel(strip.venueId, input.label)) {
      throw conflict('duplicate-strip-label', `This venue already has a strip called ${input.label}.`, {
        errors: [{ path: 'label', message: `${input.label} is already used in this venue.` }],
      });
    }
    const patch = Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined)) as Omit<UpdateStripValues, 'assetTags'>;
    // The card's asset-tag table goes in the same edit; all its rows are checked first.
    if (assetTags) applyAssetTags(tx, user, strip.venueId, assetTags, 'assetTags');
    if (Object.keys(patch).length === 0) return;
    r.updateStrip(stripId, patch);
    if (input.conductivePiste !== undefined && input.conductivePiste !== strip.conductivePiste) {
      const pistes = r.positionsOfStrip(stripId).filter((p) => p.equipmentKind === 'piste');
      if (input.conductivePiste && pistes.length === 0) {
        const entry = DEFAULT_POSITION_TEMPLATE.find((p) => p.equipmentKind === 'piste')!;
        insertPosition(tx, stripId, entry, r.positionsOfStrip(stripId).length + 1, profileOf(tx, venue.profileId));
      } else if (input.conductivePiste) {
        // Bring back the piste's steps that were dropped when it was last made non-conductive.
        const profile = profileOf(tx, venue.profileId);
        for (const p of pistes) {
          if (r.activeStepsOf(p.id).length > 0) continue;
          stepsForKind('piste', profile).forEach((s) =>
            r.insertStep({
              id: newId(),
              positionId: p.id,
              testKind: s.testKind,
              conductors: s.conductors,
              sortOrder: r.maxStepSort(p.id) + 1,
            }),
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
}

function withdrawStrip(deps: AppDeps, user: AuthUser, stripId: string, ifMatch: string | undefined, reason: string) {
  const strip = requireStrip(deps.db, user, stripId);
  return editPlan(deps, user, strip.venueId, ifMatch, `strip ${strip.label} withdrawn`, (tx) => {
    if (strip.withdrawnAt) throw conflict('already-withdrawn', `${strip.label} is already withdrawn (${strip.withdrawnReason}).`);
    planRepository(tx).updateStrip(stripId, { withdrawnReason: reason, withdrawnAt: nowIso() });
    recordAudit(tx, user, 'strip.withdrawn', 'strip', stripId, { venueId: strip.venueId, label: strip.label, reason });
  });
}

function reinstateStrip(deps: AppDeps, user: AuthUser, stripId: string, ifMatch: string | undefined) {
  const strip = requireStrip(deps.db, user, stripId);
  return editPlan(deps, user, strip.venueId, ifMatch, `strip ${strip.label} reinstated`, (tx) => {
    if (!strip.withdrawnAt) throw conflict('not-withdrawn', `${strip.label} is not withdrawn.`);
    planRepository(tx).updateStrip(stripId, { withdrawnReason: null, withdrawnAt: null });
    recordAudit(tx, user, 'strip.reinstated', 'strip', stripId, {
      venueId: strip.venueId,
      label: strip.label,
      previousReason: strip.withdrawnReason,
    });
  });
}

/** Attach a register item to a position by its asset tag, or take it off (null). */
function attachEquipment(deps: AppDeps, user: AuthUser, positionId: string, ifMatch: string | undefined, assetTag: string | null) {
  const { position, strip } = requirePosition(deps.db, user, positionId);
  return editPlan(deps, user, strip.venueId, ifMatch, `${strip.label} ${position.name} equipment`, (tx) => {
    const eq = equipmentRepository(tx);
    const before = position.equipmentId ? eq.findById(position.equipmentId) : null;
    let item = null;
    if (assetTag !== null) {
      const found = attachableItem(
        tx,
        user,
        { positionId, name: position.name, equipmentKind: position.equipmentKind, venueId: strip.venueId },
        assetTag,
      );
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
}

/** A position added to one strip by hand: it goes last, gets its kind's steps and, with a tag, its item. */
function addPosition(deps: AppDeps, user: AuthUser, stripId: string, ifMatch: string | undefined, input: AddPositionValues) {
  const strip = requireStrip(deps.db, user, stripId);
  return editPlan(deps, user, strip.venueId, ifMatch, `${strip.label} position ${input.name} added`, (tx, { venue }) => {
    if (strip.withdrawnAt) {
      throw conflict(
        'strip-withdrawn',
        `${strip.label} is withdrawn (${strip.withdrawnReason}); reinstate it before adding positions to it.`,
      );
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
    const item = assetTag
      ? attachableItem(tx, user, { positionId: null, name, equipmentKind: input.equipmentKind, venueId: strip.venueId }, assetTag).item
      : null;
    const profile = profileOf(tx, venue.profileId);
    const positionId = insertPosition(tx, stripId, { name, equipmentKind: input.equipmentKind }, r.maxPositionSort(stripId) + 1, profile);
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
}

/**
 * Takes a position off a strip, with its steps, only while nothing was recorded against it:
 * readings and faults are kept, so a tested position stays and its steps are dropped instead.
 */
function removePosition(deps: AppDeps, user: AuthUser, positionId: string, ifMatch: string | undefined) {
  const { position, strip } = requirePosition(deps.db, user, positionId);
  return editPlan(deps, user, strip.venueId, ifMatch, `${strip.label} position ${position.name} removed`, (tx) => {
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
}

function addStep(deps: AppDeps, user: AuthUser, positionId: string, ifMatch: string | undefined, input: AddStepInput) {
  const { position, strip } = requirePosition(deps.db, user, positionId);
  return editPlan(deps, user, strip.venueId, ifMatch, `${strip.label} ${position.name} step added`, (tx, { venue }) => {
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
}

/** Drops a step from the checklist; it stays stored because readings point at it. */
function dropStep(deps: AppDeps, user: AuthUser, stepId: string, ifMatch: string | undefined) {
  const found = planRepository(deps.db).findStep(stepId);
  if (!found) throw notFound('That step');
  const { step, position, strip } = found;
  return editPlan(deps, user, strip.venueId, ifMatch, `${strip.label} ${position.name} step dropped`, (tx) => {
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
}

type Rest<F> = F extends (deps: AppDeps, ...rest: infer R) => infer Out ? (...rest: R) => Out : never;
const bind = <F extends (deps: AppDeps, ...rest: never[]) => unknown>(deps: AppDeps, f: F): Rest<F> =>
  ((...rest: never[]) => f(deps, ...rest)) as Rest<F>;

export function stripPlanService(deps: AppDeps) {
  return {
    updateStrip: bind(deps, updateStrip),
    withdrawStrip: bind(deps, withdrawStrip),
    reinstateStrip: bind(deps, reinstateStrip),
    attachEquipment: bind(deps, attachEquipment),
    addPosition: bind(deps, addPosition),
    removePosition: bind(deps, removePosition),
    addStep: bind(deps, addStep),
    dropStep: bind(deps, dropStep),
  };
}
