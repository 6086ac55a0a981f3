import { api } from '@/lib/api-client';
import { ifMatch, usePlanEdit } from './plan-edit';
import type { VenuePlan } from './types';

type Vars = { positionId: string };
export const removePosition = ({ positionId, version }: Vars & { version: number }) =>
  api.delete<VenuePlan>(`/positions/${positionId}`, ifMatch(version));
export const useRemovePosition = (venueId: string) => usePlanEdit<Vars>(venueId, removePosition);
