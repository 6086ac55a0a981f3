import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Role } from '@shared/schemas/common';

export interface Person {
  id: string;
  email: string;
  name: string;
  role: Role;
  disabled: boolean;
  invited: boolean;
}

export const getUsers = () => api.get<Person[]>('/users');
export const usersQueryOptions = () => queryOptions({ queryKey: ['users'], queryFn: getUsers });
export const useUsers = () => useQuery(usersQueryOptions());
