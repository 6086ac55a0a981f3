import { api } from '@/lib/api-client';
import type { AddStepInput } from '@shared/schemas/plan';
import { ifMatch, usePlanEdit } from './plan-edit';
import type { VenuePlan } from './types';

type Vars = { positionId: string; step: AddStepInput };
export const addStep = ({ positionId, step, version }: Vars & { version: number }) =>
  api.post<VenuePlan>(`/positions/${positionId}/steps`, step as Record<string, unknown>, ifMatch(version));
export const useAddStep = (venueId: string) => usePlanEdit<Vars>(venueId, addStep);
