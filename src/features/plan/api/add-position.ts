import { api } from '@/lib/api-client';
import type { AddPositionInput } from '@shared/schemas/plan';
import { ifMatch, usePlanEdit } from './plan-edit';
import type { VenuePlan } from './types';

type Vars = { stripId: string; position: AddPositionInput };
export const addPosition = ({ stripId, position, version }: Vars & { version: number }) =>
  api.post<VenuePlan>(`/strips/${stripId}/positions`, position as Record<string, unknown>, ifMatch(version));
export const useAddPosition = (venueId: string) => usePlanEdit<Vars>(venueId, addPosition);
