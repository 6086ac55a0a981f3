import { call } from '@/lib/api-client';
import { planContracts } from '@shared/contracts/plan';
import { ifMatch, usePlanEdit } from './plan-edit';

type Vars = { userIds: string[] };
export const setTechnicians = (venueId: string, { userIds, version }: Vars & { version: number }) =>
  call(planContracts.setTechnicians, { params: { id: venueId }, body: { userIds }, headers: ifMatch(version) });
export const useSetTechnicians = (venueId: string) => usePlanEdit<Vars>(venueId, (v) => setTechnicians(venueId, v));
