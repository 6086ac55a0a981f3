import { call } from '@/lib/api-client';
import { planContracts } from '@shared/contracts/plan';
import { ifMatch, usePlanEdit } from './plan-edit';

type Vars = { positionId: string };
export const removePosition = ({ positionId, version }: Vars & { version: number }) =>
  call(planContracts.removePosition, { params: { id: positionId }, headers: ifMatch(version) });
export const useRemovePosition = (venueId: string) => usePlanEdit<Vars>(venueId, removePosition);
