import { api } from '@/lib/api-client';
import { ifMatch, usePlanEdit } from './plan-edit';
import type { VenuePlan } from './types';

type Vars = { userIds: string[] };
export const setTechnicians = (venueId: string, { userIds, version }: Vars & { version: number }) =>
  api.put<VenuePlan>(`/venues/${venueId}/technicians`, { userIds }, ifMatch(version));
export const useSetTechnicians = (venueId: string) => usePlanEdit<Vars>(venueId, (v) => setTechnicians(venueId, v));
