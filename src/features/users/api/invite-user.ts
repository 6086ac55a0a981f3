import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { usersContracts } from '@shared/contracts/users';
import type { InviteUserInput } from '@shared/schemas/auth';
import { usersQueryOptions } from './get-users';

export const inviteUser = (input: InviteUserInput) => call(usersContracts.invite, { body: input });

export const useInviteUser = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: inviteUser,
    onSuccess: () => qc.invalidateQueries({ queryKey: usersQueryOptions().queryKey }),
  });
};
