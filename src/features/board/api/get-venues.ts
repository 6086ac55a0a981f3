import { queryOptions, useQuery } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { venuesContracts, type VenueSummary } from '@shared/contracts/venues';

export type { VenueSummary };

export const getVenues = () => call(venuesContracts.list);
export const venuesQueryOptions = () => queryOptions({ queryKey: ['venues'], queryFn: getVenues });
export const useVenues = () => useQuery(venuesQueryOptions());
