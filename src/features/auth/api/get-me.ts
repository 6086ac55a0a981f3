import { queryOptions, useQuery } from '@tanstack/react-query';
import { ApiError, call } from '@/lib/api-client';
import { authContracts } from '@shared/contracts/auth';
import type { PublicUser } from '@shared/schemas/auth';

export const getMe = async (): Promise<PublicUser | null> => {
  try {
    const res = await call(authContracts.me);
    return res.user;
  } catch (err) {
    if (err instanceof ApiError && err.status === 401) return null;
    throw err;
  }
};

export const meQueryOptions = () => queryOptions({ queryKey: ['auth', 'me'], queryFn: getMe, staleTime: 60_000 });

export const useMe = () => useQuery(meQueryOptions());
