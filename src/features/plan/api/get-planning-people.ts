import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { PlanningPeople } from './types';

export const getPlanningPeople = () => api.get<PlanningPeople>('/planning/people');
export const planningPeopleQueryOptions = () => queryOptions({ queryKey: ['planning', 'people'], queryFn: getPlanningPeople, staleTime: 60_000 });
export const usePlanningPeople = (enabled = true) => useQuery({ ...planningPeopleQueryOptions(), enabled });
