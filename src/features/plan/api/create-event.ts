import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CreateEventInput } from '@shared/schemas/plan';
import { eventsQueryOptions } from './get-events';
import type { EventDetail } from './types';

export const createEvent = (input: CreateEventInput) => api.post<EventDetail>('/events', input as Record<string, unknown>);

export const useCreateEvent = () => {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createEvent, onSuccess: () => qc.invalidateQueries({ queryKey: eventsQueryOptions().queryKey }) });
};
