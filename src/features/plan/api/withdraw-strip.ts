import { api } from '@/lib/api-client';
import { ifMatch, usePlanEdit } from './plan-edit';
import type { VenuePlan } from './types';

type Vars = { stripId: string; reason: string };
export const withdrawStrip = ({ stripId, reason, version }: Vars & { version: number }) =>
  api.post<VenuePlan>(`/strips/${stripId}/withdraw`, { reason }, ifMatch(version));
export const useWithdrawStrip = (venueId: string) => usePlanEdit<Vars>(venueId, withdrawStrip);
