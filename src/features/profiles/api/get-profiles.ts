import { queryOptions, useQuery } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { profilesContracts } from '@shared/contracts/profiles';

export const getProfiles = () => call(profilesContracts.list);
export const profilesQueryOptions = () => queryOptions({ queryKey: ['profiles'], queryFn: getProfiles });
export const useProfiles = () => useQuery(profilesQueryOptions());
