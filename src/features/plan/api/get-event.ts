import { queryOptions, useQuery } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { planContracts } from '@shared/contracts/plan';

export const getEvent = (id: string) => call(planContracts.getEvent, { params: { id } });
export const eventQueryOptions = (id: string) => queryOptions({ queryKey: ['events', id], queryFn: () => getEvent(id) });
export const useEvent = (id: string) => useQuery(eventQueryOptions(id));
