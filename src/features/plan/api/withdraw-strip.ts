import { call } from '@/lib/api-client';
import { planContracts } from '@shared/contracts/plan';
import { ifMatch, usePlanEdit } from './plan-edit';

type Vars = { stripId: string; reason: string };
export const withdrawStrip = ({ stripId, reason, version }: Vars & { version: number }) =>
  call(planContracts.withdrawStrip, { params: { id: stripId }, body: { reason }, headers: ifMatch(version) });
export const useWithdrawStrip = (venueId: string) => usePlanEdit<Vars>(venueId, withdrawStrip);
