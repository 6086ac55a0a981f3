import { call } from '@/lib/api-client';
import { planContracts } from '@shared/contracts/plan';
import type { AssetTagsInput } from '@shared/schemas/plan';
import { ifMatch, usePlanEdit } from './plan-edit';

type Vars = { positions: AssetTagsInput['positions'] };
export const setAssetTags = (venueId: string, { positions, version }: Vars & { version: number }) =>
  call(planContracts.setAssetTags, { params: { id: venueId }, body: { positions }, headers: ifMatch(version) });
export const useSetAssetTags = (venueId: string) => usePlanEdit<Vars>(venueId, (vars) => setAssetTags(venueId, vars));
