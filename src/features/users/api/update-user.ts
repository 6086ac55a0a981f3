import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { UpdateUserInput } from '@shared/schemas/auth';
import { usersQueryOptions, type Person } from './get-users';

export const updateUser = ({ id, ...patch }: UpdateUserInput & { id: string }) => api.patch<Person>(`/users/${id}`, patch);

export const useUpdateUser = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateUser,
    onSuccess: () => qc.invalidateQueries({ queryKey: usersQueryOptions().queryKey }),
  });
};
