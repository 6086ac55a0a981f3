import { queryOptions, useQuery } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { signOffContracts, type Readiness } from '@shared/contracts/sign-off';

export type ReadinessDto = Readiness;

export const getReadiness = (venueId: string) => call(signOffContracts.readiness, { params: { id: venueId } });
export const readinessQueryOptions = (venueId: string) =>
  queryOptions({ queryKey: ['venues', venueId, 'readiness'], queryFn: () => getReadiness(venueId) });
export const useReadiness = (venueId: string) => useQuery(readinessQueryOptions(venueId));
