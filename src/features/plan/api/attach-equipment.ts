import { api } from '@/lib/api-client';
import { ifMatch, usePlanEdit } from './plan-edit';
import type { VenuePlan } from './types';

type Vars = { positionId: string; assetTag: string | null };
export const attachEquipment = ({ positionId, assetTag, version }: Vars & { version: number }) =>
  api.put<VenuePlan>(`/positions/${positionId}/equipment`, { assetTag }, ifMatch(version));
export const useAttachEquipment = (venueId: string) => usePlanEdit<Vars>(venueId, attachEquipment);
