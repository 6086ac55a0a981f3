import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { planContracts } from '@shared/contracts/plan';
import type { CreateVenueInput } from '@shared/schemas/plan';
import { eventsQueryOptions } from './get-events';

export const createVenue = ({ eventId, ...input }: CreateVenueInput & { eventId: string }) =>
  call(planContracts.createVenue, { params: { id: eventId }, body: input });

export const useCreateVenue = () => {
  const qc = useQueryClient();
  // Invalidates the events list and every event detail (they share the prefix).
  return useMutation({ mutationFn: createVenue, onSuccess: () => qc.invalidateQueries({ queryKey: eventsQueryOptions().queryKey }) });
};
