import { call } from '@/lib/api-client';
import { planContracts } from '@shared/contracts/plan';
import type { AddStepInput } from '@shared/schemas/plan';
import { ifMatch, usePlanEdit } from './plan-edit';

type Vars = { positionId: string; step: AddStepInput };
export const addStep = ({ positionId, step, version }: Vars & { version: number }) =>
  call(planContracts.addStep, { params: { id: positionId }, body: step, headers: ifMatch(version) });
export const useAddStep = (venueId: string) => usePlanEdit<Vars>(venueId, addStep);
