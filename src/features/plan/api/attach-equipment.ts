import { call } from '@/lib/api-client';
import { planContracts } from '@shared/contracts/plan';
import { ifMatch, usePlanEdit } from './plan-edit';

type Vars = { positionId: string; assetTag: string | null };
export const attachEquipment = ({ positionId, assetTag, version }: Vars & { version: number }) =>
  call(planContracts.attachEquipment, { params: { id: positionId }, body: { assetTag }, headers: ifMatch(version) });
export const useAttachEquipment = (venueId: string) => usePlanEdit<Vars>(venueId, attachEquipment);
