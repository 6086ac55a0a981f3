// Asset tags for many positions of one venue in one edit (a strip, a row of the hall): every tag
// is checked first and all problems are answered together; the change is one transaction, so a
// refused list changes nothing.
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import type { Tx } from '../db/client';
import { planRepository } from '../db/plan.repository';
import { equipmentRepository } from '../db/equipment.repository';
import { recordAudit } from '../db/audit.repository';
import { editPlan } from './plan-edit';
import { AppError } from '../lib/app-error';
import { nowIso } from '../lib/ids';
import { EQUIPMENT_KIND_LABELS } from '../../shared/schemas/equipment';
import type { AssetTagsValues } from '../../shared/schemas/plan';

type Entry = AssetTagsValues['positions'][number];
type Problem = { path: string; message: string; inUse?: boolean };
type Change = { entry: Entry; position: { id: string; name: string }; stripLabel: string; itemId: string | null; before: string | null };

const kindWord = (k: keyof typeof EQUIPMENT_KIND_LABELS) => EQUIPMENT_KIND_LABELS[k].toLowerCase();

/** The positions whose item changes, with the item each takes; problems instead where a tag cannot go. */
function plan(tx: Tx, user: AuthUser, venueId: string, entries: Entry[], field: string) {
  const r = planRepository(tx);
  const eq = equipmentRepository(tx);
  const problems: Problem[] = [];
  const changes: Change[] = [];
  const found = entries.map((e) => r.findPosition(e.positionId));
  // Positions given new items free their old ones, so two tags can swap places in one list.
  const listed = new Set(entries.map((e) => e.positionId));
  entries.forEach((entry, i) => {
    const at = found[i];
    const path = `${field}.${i}.assetTag`;
    if (!at || at.strip.venueId !== venueId) {
      problems.push({ path: `${field}.${i}.positionId`, message: `Row ${i + 1} is not a position of this venue.` });
      return;
    }
    const where = `${at.strip.label}, ${at.position.name}`;
    const before = at.position.equipmentId ? (eq.findById(at.position.equipmentId)?.assetTag ?? null) : null;
    if (entry.assetTag === before) return;
    if (entry.assetTag === null) {
      changes.push({ entry, position: at.position, stripLabel: at.strip.label, itemId: null, before });
      return;
    }
    const item = eq.findByTag(user.orgId, entry.assetTag);
    const tag = entry.assetTag;
    if (!item) return void problems.push({ path, message: `${where}: there is no item with the asset tag ${tag} in the register.` });
    if (item.kind !== at.position.equipmentKind) {
      return void problems.push({
        path,
        message: `${where}: ${tag} is a ${kindWord(item.kind)}, but this position takes a ${kindWord(at.position.equipmentKind)}.`,
      });
    }
    if (item.status === 'retired')
      return void problems.push({ path, message: `${where}: ${tag} is retired and cannot go back on a strip.` });
    const elsewhere = eq.positionInVenue(item.id, venueId);
    if (elsewhere && !listed.has(elsewhere.positionId)) {
      return void problems.push({
        path,
        inUse: true,
        message: `${where}: ${tag} is already on ${elsewhere.stripLabel} (${elsewhere.positionName}); take it off there first or list that position too.`,
      });
    }
    changes.push({ entry, position: at.position, stripLabel: at.strip.label, itemId: item.id, before });
  });
  return { problems, changes };
}

function refuse(problems: Problem[]): never {
  // Only items sitting elsewhere: the plan's state is in the way (409); otherwise the list is wrong (422).
  const conflictOnly = problems.every((p) => p.inUse);
  const first = problems[0].message;
  const message =
    problems.length === 1 ? `Nothing was saved. ${first}` : `Nothing was saved: ${problems.length} rows need a change. The first: ${first}`;
  throw new AppError(conflictOnly ? 409 : 422, conflictOnly ? 'item-in-use' : 'cannot-attach', message, {
    errors: problems.map(({ path, message: m }) => ({ path, message: m })),
  });
}

/**
 * The tags of the list put in place inside a plan edit's transaction, or all refused. `field` is
 * where the list sits in the request body, so each problem names its row there.
 */
export function applyAssetTags(tx: Tx, user: AuthUser, venueId: string, entries: Entry[], field = 'positions') {
  const { problems, changes } = plan(tx, user, venueId, entries, field);
  if (problems.length > 0) refuse(problems);
  const eq = equipmentRepository(tx);
  const at = nowIso();
  // Everything changing comes off first, so an item moved within the list is never in two places.
  for (const c of changes) eq.assignToPosition(c.position.id, null, user.id, at);
  for (const c of changes) {
    if (c.itemId) eq.assignToPosition(c.position.id, c.itemId, user.id, at);
    recordAudit(tx, user, c.itemId ? 'position.equipment-attached' : 'position.equipment-removed', 'position', c.position.id, {
      venueId,
      strip: c.stripLabel,
      position: c.position.name,
      assetTag: c.entry.assetTag,
      previousAssetTag: c.before,
      inList: entries.length,
    });
  }
}

function setAssetTags(deps: AppDeps, user: AuthUser, venueId: string, ifMatch: string | undefined, entries: Entry[]) {
  return editPlan(deps, user, venueId, ifMatch, `asset tags of ${entries.length} positions`, (tx) =>
    applyAssetTags(tx, user, venueId, entries),
  );
}

export function assetTagsService(deps: AppDeps) {
  return {
    setAssetTags: (user: AuthUser, venueId: string, ifMatch: string | undefined, entries: Entry[]) =>
      setAssetTags(deps, user, venueId, ifMatch, entries),
  };
}
