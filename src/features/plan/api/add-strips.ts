import { call } from '@/lib/api-client';
import { planContracts } from '@shared/contracts/plan';
import type { BulkStripsInput } from '@shared/schemas/plan';
import { ifMatch, usePlanEdit } from './plan-edit';

export const addStrips = (venueId: string, { version, ...body }: BulkStripsInput & { version: number }) =>
  call(planContracts.addStrips, { params: { id: venueId }, body, headers: ifMatch(version) });
export const useAddStrips = (venueId: string) => usePlanEdit<BulkStripsInput>(venueId, (v) => addStrips(venueId, v));
