import { queryOptions, useQuery } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { planContracts } from '@shared/contracts/plan';

export const getPlanningPeople = () => call(planContracts.people);
export const planningPeopleQueryOptions = () =>
  queryOptions({ queryKey: ['planning', 'people'], queryFn: getPlanningPeople, staleTime: 60_000 });
export const usePlanningPeople = (enabled = true) => useQuery({ ...planningPeopleQueryOptions(), enabled });
