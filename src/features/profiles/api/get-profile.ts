import { queryOptions, useQuery } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { profilesContracts } from '@shared/contracts/profiles';

export const getProfile = (id: string) => call(profilesContracts.get, { params: { id } });
export const profileQueryOptions = (id: string) => queryOptions({ queryKey: ['profiles', id], queryFn: () => getProfile(id) });
export const useProfile = (id: string) => useQuery(profileQueryOptions(id));
