import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { planContracts } from '@shared/contracts/plan';
import type { CreateEventInput } from '@shared/schemas/plan';
import { eventsQueryOptions } from './get-events';

export const createEvent = (input: CreateEventInput) => call(planContracts.createEvent, { body: input });

export const useCreateEvent = () => {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createEvent, onSuccess: () => qc.invalidateQueries({ queryKey: eventsQueryOptions().queryKey }) });
};
