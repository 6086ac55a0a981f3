// The venue's pool of spares: a strip of its own (never on the board, the plan or a certificate)
// with one position per spare, so a spare is tested with its kind's checklist on the testing
// screen like any position, before the event.
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import type { Db, Tx } from '../db/client';
import { accessService } from './access.service';
import { incidentsRepository } from '../db/incidents.repository';
import { equipmentRepository } from '../db/equipment.repository';
import { planRepository } from '../db/plan.repository';
import { signOffRepository } from '../db/sign-off.repository';
import { recordAudit } from '../db/audit.repository';
import { conflict, unprocessable } from '../lib/app-error';
import { newId, nowIso } from '../lib/ids';
import { insertPosition, profileOf } from './plan-edit';
import type { SparesInput } from '../../shared/schemas/incidents';

// A zero-width space ends the label: names people type have it removed (cleanTypedName), so no
// strip of the plan can ever take the pool's label.
export const POOL_LABEL = 'Spares\u200b';
const spareName = (assetTag: string) => `Spare ${assetTag}`;

/** Each spare's checklist by its latest readings taken on the spare itself. */
export function sparePool(db: Db | Tx, venueId: string) {
  const repo = incidentsRepository(db);
  const pool = repo.poolStrip(venueId);
  if (!pool) return { venueId, stripId: null, spares: [] };
  const plan = planRepository(db);
  const rows = signOffRepository(db).stepsWithLatestReading(venueId).filter((r) => r.stripId === pool.id && r.required);
  const positions = plan.positionsOfStrip(pool.id);
  const swaps = repo.swapsOfVenueSpares(positions.map((p) => p.id));
  const spares = positions.flatMap((p) => {
    const swap = p.equipmentId ? undefined : swaps.find((s) => s.sparePositionId === p.id);
    const itemId = p.equipmentId ?? swap?.replacementEquipmentId;
    if (!itemId) return [];
    const item = equipmentRepository(db).findById(itemId)!;
    const steps = rows.filter((r) => r.positionId === p.id);
    const passed = steps.filter((r) => r.reading && r.reading.equipmentId === item.id && r.reading.verdict !== 'fail').length;
    const into = swap ? plan.findPosition(swap.positionId) : undefined;
    return [
      {
        equipment: { id: item.id, assetTag: item.assetTag, kind: item.kind, description: item.description, status: item.status },
        positionId: p.id,
        stepsTotal: steps.length,
        stepsPassed: passed,
        tested: passed === steps.length,
        usedIn:
          swap && into
            ? { incidentId: swap.incidentId, stripId: into.strip.id, stripLabel: into.strip.label, positionName: into.position.name, at: swap.createdAt }
            : null,
      },
    ];
  });
  return { venueId, stripId: pool.id, spares };
}

function poolStripOf(tx: Tx, venueId: string): string {
  const found = incidentsRepository(tx).poolStrip(venueId);
  if (found) return found.id;
  const id = newId();
  planRepository(tx).insertStrip({ id, venueId, label: POOL_LABEL, sortOrder: 0, sparePool: true, conductivePiste: false });
  return id;
}

function setSpares(deps: AppDeps, user: AuthUser, venueId: string, input: SparesInput) {
  const row = accessService(deps.db).requireVenue(user, venueId, 'plan');
  deps.db.transaction((tx) => {
    const stripId = poolStripOf(tx, venueId);
    const plan = planRepository(tx);
    const items = equipmentRepository(tx);
    const profile = profileOf(tx, row.venue.profileId);
    const positions = plan.positionsOfStrip(stripId);
    const wanted = new Set(input.assetTags);
    const at = nowIso();
    // Spares taken out of the pool: their position stays (its readings are kept), empty.
    for (const p of positions) {
      const item = p.equipmentId ? items.findById(p.equipmentId) : undefined;
      if (item && !wanted.has(item.assetTag)) items.assignToPosition(p.id, null, user.id, at);
    }
    input.assetTags.forEach((tag, k) => {
      const item = items.findByTag(user.orgId, tag);
      const refuse = (code: string, message: string) =>
        unprocessable(code, message, { errors: [{ path: `assetTags.${k}`, message }] });
      if (!item) throw refuse('unknown-item', `There is no item with the asset tag ${tag} in the register.`);
      if (item.status === 'retired') throw refuse('retired-item', `${tag} is retired and cannot be a spare.`);
      const elsewhere = items.positionInVenue(item.id, venueId);
      if (elsewhere && elsewhere.stripId !== stripId) {
        throw conflict('item-in-use', `${tag} is on ${elsewhere.stripLabel} (${elsewhere.positionName}) in this venue, not free to be a spare.`, {
          errors: [{ path: `assetTags.${k}`, message: `Already on ${elsewhere.stripLabel}.` }],
        });
      }
      if (elsewhere) return;
      // A spare back in the pool takes its old position again, with the readings it had there.
      const previous = positions.find((p) => p.name === spareName(tag) && p.equipmentId === null && p.equipmentKind === item.kind);
      const positionId =
        previous?.id ?? insertPosition(tx, stripId, { name: spareName(tag), equipmentKind: item.kind }, positions.length + k + 1, profile);
      items.assignToPosition(positionId, item.id, user.id, at);
    });
    recordAudit(tx, user, 'venue.spares-set', 'venue', venueId, { assetTags: input.assetTags });
  });
  return sparePool(deps.db, venueId);
}

export function sparesService(deps: AppDeps) {
  return {
    get(user: AuthUser, venueId: string) {
      accessService(deps.db).requireVenue(user, venueId, 'read');
      return sparePool(deps.db, venueId);
    },
    set: (user: AuthUser, venueId: string, input: SparesInput) => setSpares(deps, user, venueId, input),
  };
}
