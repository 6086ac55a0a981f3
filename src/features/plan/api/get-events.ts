import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { EventSummary } from './types';

export const getEvents = () => api.get<EventSummary[]>('/events');
export const eventsQueryOptions = () => queryOptions({ queryKey: ['events'], queryFn: getEvents });
export const useEvents = () => useQuery(eventsQueryOptions());
