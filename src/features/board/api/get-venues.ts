import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { StripStatus } from '@shared/domain/progress';

export interface VenueSummary {
  id: string;
  name: string;
  eventId: string;
  eventName: string;
  startsOn: string;
  endsOn: string;
  status: 'planning' | 'testing' | 'signed-off';
  stripCount: number;
  byStatus: Record<StripStatus, number>;
  stepsTotal: number;
  stepsDone: number;
}

export const getVenues = () => api.get<VenueSummary[]>('/venues');
export const venuesQueryOptions = () => queryOptions({ queryKey: ['venues'], queryFn: getVenues });
export const useVenues = () => useQuery(venuesQueryOptions());
