import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ProfileDetail } from './types';

export const getProfile = (id: string) => api.get<ProfileDetail>(`/profiles/${id}`);
export const profileQueryOptions = (id: string) => queryOptions({ queryKey: ['profiles', id], queryFn: () => getProfile(id) });
export const useProfile = (id: string) => useQuery(profileQueryOptions(id));
