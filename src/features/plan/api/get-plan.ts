import { queryOptions, useQuery } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { planContracts } from '@shared/contracts/plan';

export const getPlan = (venueId: string) => call(planContracts.getPlan, { params: { id: venueId } });
export const planQueryOptions = (venueId: string) =>
  queryOptions({ queryKey: ['venues', venueId, 'plan'], queryFn: () => getPlan(venueId) });
// No refetch on focus: the editor shows the version it was loaded with until the person reloads it.
export const usePlan = (venueId: string) => useQuery({ ...planQueryOptions(venueId), refetchOnWindowFocus: false });
