import { call } from '@/lib/api-client';
import { planContracts } from '@shared/contracts/plan';
import type { UpdateVenueInput } from '@shared/schemas/plan';
import { ifMatch, usePlanEdit } from './plan-edit';

export const updateVenue = (venueId: string, { version, ...patch }: UpdateVenueInput & { version: number }) =>
  call(planContracts.updateVenue, { params: { id: venueId }, body: patch, headers: ifMatch(version) });
export const useUpdateVenue = (venueId: string) => usePlanEdit<UpdateVenueInput>(venueId, (v) => updateVenue(venueId, v));
