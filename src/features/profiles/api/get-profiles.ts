import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ProfileSummary } from './types';

export const getProfiles = () => api.get<ProfileSummary[]>('/profiles');
export const profilesQueryOptions = () => queryOptions({ queryKey: ['profiles'], queryFn: getProfiles });
export const useProfiles = () => useQuery(profilesQueryOptions());
