import { queryOptions, useQuery } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { planContracts } from '@shared/contracts/plan';

export const getEvents = () => call(planContracts.listEvents);
export const eventsQueryOptions = () => queryOptions({ queryKey: ['events'], queryFn: getEvents });
export const useEvents = () => useQuery(eventsQueryOptions());
