import { api } from '@/lib/api-client';
import { ifMatch, usePlanEdit } from './plan-edit';
import type { VenuePlan } from './types';

type Vars = { stepId: string };
export const dropStep = ({ stepId, version }: Vars & { version: number }) => api.delete<VenuePlan>(`/steps/${stepId}`, ifMatch(version));
export const useDropStep = (venueId: string) => usePlanEdit<Vars>(venueId, dropStep);
