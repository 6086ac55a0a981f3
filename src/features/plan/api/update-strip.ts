import { api } from '@/lib/api-client';
import type { UpdateStripInput } from '@shared/schemas/plan';
import { ifMatch, usePlanEdit } from './plan-edit';
import type { VenuePlan } from './types';

type Vars = { stripId: string; patch: UpdateStripInput };
export const updateStrip = ({ stripId, patch, version }: Vars & { version: number }) =>
  api.patch<VenuePlan>(`/strips/${stripId}`, patch as Record<string, unknown>, ifMatch(version));
export const useUpdateStrip = (venueId: string) => usePlanEdit<Vars>(venueId, updateStrip);
