import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { InviteUserInput } from '@shared/schemas/auth';
import { usersQueryOptions, type Person } from './get-users';

export const inviteUser = (input: InviteUserInput) => api.post<Person>('/users', input);

export const useInviteUser = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: inviteUser,
    onSuccess: () => qc.invalidateQueries({ queryKey: usersQueryOptions().queryKey }),
  });
};
