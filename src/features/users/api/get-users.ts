import { queryOptions, useQuery } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { usersContracts, type Person } from '@shared/contracts/users';

export type { Person };

export const getUsers = () => call(usersContracts.list);
export const usersQueryOptions = () => queryOptions({ queryKey: ['users'], queryFn: getUsers });
export const useUsers = () => useQuery(usersQueryOptions());
