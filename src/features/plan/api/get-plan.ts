import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { VenuePlan } from './types';

export const getPlan = (venueId: string) => api.get<VenuePlan>(`/venues/${venueId}`);
export const planQueryOptions = (venueId: string) => queryOptions({ queryKey: ['venues', venueId, 'plan'], queryFn: () => getPlan(venueId) });
// No refetch on focus: the editor shows the version it was loaded with until the person reloads it.
export const usePlan = (venueId: string) => useQuery({ ...planQueryOptions(venueId), refetchOnWindowFocus: false });
