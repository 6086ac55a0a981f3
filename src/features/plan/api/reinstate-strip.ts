import { api } from '@/lib/api-client';
import { ifMatch, usePlanEdit } from './plan-edit';
import type { VenuePlan } from './types';

type Vars = { stripId: string };
export const reinstateStrip = ({ stripId, version }: Vars & { version: number }) =>
  api.post<VenuePlan>(`/strips/${stripId}/reinstate`, {}, ifMatch(version));
export const useReinstateStrip = (venueId: string) => usePlanEdit<Vars>(venueId, reinstateStrip);
