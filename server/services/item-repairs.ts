// What a repair does to the register item: a section cut out (shorter), or another item swapped in.
import type { AuthUser } from '../auth/types';
import type { Tx } from '../db/client';
import { equipmentRepository, type EquipmentRow } from '../db/equipment.repository';
import { faultsRepository } from '../db/faults.repository';
import type { stripsRepository } from '../db/strips.repository';
import { unprocessable } from '../lib/app-error';
import { formatLength } from '../../shared/domain/units';

type PositionContext = NonNullable<ReturnType<ReturnType<typeof stripsRepository>['positionContext']>>;

/** A section cut out of the item: its length goes down by what was removed (mm resolution). Answers the length before. */
export function cutOut(tx: Tx, user: AuthUser, item: EquipmentRow, lengthRemovedM: number): number {
  const before = item.lengthM;
  if (before === null) {
    throw unprocessable('no-length', `The length of ${item.assetTag} is not recorded; record it in the equipment register first.`, {
      errors: [{ path: 'lengthRemovedM', message: 'The item has no recorded length' }],
    });
  }
  if (lengthRemovedM >= before) {
    // Worded in the person's units: the form shows this under the field they typed in.
    const [cut, whole] = [formatLength(lengthRemovedM, user.unitSystem), formatLength(before, user.unitSystem)];
    throw unprocessable('cut-too-long', `${cut} is not less than the ${whole} of ${item.assetTag}; retire the item instead.`, {
      errors: [{ path: 'lengthRemovedM', message: `Must be less than the item's ${whole}` }],
    });
  }
  // Millimetre resolution: 12 − 1.5 stays 10.5, not 10.499999999999998.
  const after = Math.round((before - lengthRemovedM) * 1000) / 1000;
  equipmentRepository(tx).update(item.id, { lengthM: after, version: item.version + 1 });
  return before;
}

/** Another item of the same kind, in service and on no other strip of the venue, goes in the position. Answers its id. */
export function swapIn(
  tx: Tx,
  user: AuthUser,
  position: PositionContext,
  item: EquipmentRow,
  replacementAssetTag: string,
  at: string,
): string {
  const equipment = equipmentRepository(tx);
  const replacement = equipment.findByTag(user.orgId, replacementAssetTag);
  const refuse = (message: string) => unprocessable('bad-replacement', message, { errors: [{ path: 'replacementAssetTag', message }] });
  if (!replacement) throw refuse(`No item with asset tag ${replacementAssetTag} in the register.`);
  if (replacement.id === item.id) throw refuse('The replacement is the same item.');
  if (replacement.kind !== item.kind) throw refuse(`${replacement.assetTag} is a ${replacement.kind}, not a ${item.kind}.`);
  if (replacement.status !== 'in-service') throw refuse(`${replacement.assetTag} is not in service (${replacement.status}).`);
  const holder = faultsRepository(tx).stripHoldingItem(position.venue.id, replacement.id);
  if (holder) throw refuse(`${replacement.assetTag} is already on ${holder.stripLabel} of this venue.`);
  equipment.assignToPosition(position.position.id, replacement.id, user.id, at);
  equipment.update(item.id, { status: 'under-repair', version: item.version + 1 });
  return replacement.id;
}
