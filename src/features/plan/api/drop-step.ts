import { call } from '@/lib/api-client';
import { planContracts } from '@shared/contracts/plan';
import { ifMatch, usePlanEdit } from './plan-edit';

type Vars = { stepId: string };
export const dropStep = ({ stepId, version }: Vars & { version: number }) =>
  call(planContracts.dropStep, { params: { id: stepId }, headers: ifMatch(version) });
export const useDropStep = (venueId: string) => usePlanEdit<Vars>(venueId, dropStep);
