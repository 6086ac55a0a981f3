import { api } from '@/lib/api-client';
import type { UpdateVenueInput } from '@shared/schemas/plan';
import { ifMatch, usePlanEdit } from './plan-edit';
import type { VenuePlan } from './types';

export const updateVenue = (venueId: string, { version, ...patch }: UpdateVenueInput & { version: number }) =>
  api.patch<VenuePlan>(`/venues/${venueId}`, patch as Record<string, unknown>, ifMatch(version));
export const useUpdateVenue = (venueId: string) => usePlanEdit<UpdateVenueInput>(venueId, (v) => updateVenue(venueId, v));
