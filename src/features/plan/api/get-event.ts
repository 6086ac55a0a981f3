import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { EventDetail } from './types';

export const getEvent = (id: string) => api.get<EventDetail>(`/events/${id}`);
export const eventQueryOptions = (id: string) => queryOptions({ queryKey: ['events', id], queryFn: () => getEvent(id) });
export const useEvent = (id: string) => useQuery(eventQueryOptions(id));
