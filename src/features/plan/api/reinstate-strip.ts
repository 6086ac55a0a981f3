import { call } from '@/lib/api-client';
import { planContracts } from '@shared/contracts/plan';
import { ifMatch, usePlanEdit } from './plan-edit';

type Vars = { stripId: string };
export const reinstateStrip = ({ stripId, version }: Vars & { version: number }) =>
  call(planContracts.reinstateStrip, { params: { id: stripId }, headers: ifMatch(version) });
export const useReinstateStrip = (venueId: string) => usePlanEdit<Vars>(venueId, reinstateStrip);
