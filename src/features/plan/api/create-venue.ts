import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CreateVenueInput } from '@shared/schemas/plan';
import { eventsQueryOptions } from './get-events';
import type { VenuePlan } from './types';

export const createVenue = ({ eventId, ...input }: CreateVenueInput & { eventId: string }) =>
  api.post<VenuePlan>(`/events/${eventId}/venues`, input as Record<string, unknown>);

export const useCreateVenue = () => {
  const qc = useQueryClient();
  // Invalidates the events list and every event detail (they share the prefix).
  return useMutation({ mutationFn: createVenue, onSuccess: () => qc.invalidateQueries({ queryKey: eventsQueryOptions().queryKey }) });
};
