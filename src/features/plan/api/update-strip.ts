import { call } from '@/lib/api-client';
import { planContracts } from '@shared/contracts/plan';
import type { UpdateStripInput } from '@shared/schemas/plan';
import { ifMatch, usePlanEdit } from './plan-edit';

type Vars = { stripId: string; patch: UpdateStripInput };
export const updateStrip = ({ stripId, patch, version }: Vars & { version: number }) =>
  call(planContracts.updateStrip, { params: { id: stripId }, body: patch, headers: ifMatch(version) });
export const useUpdateStrip = (venueId: string) => usePlanEdit<Vars>(venueId, updateStrip);
