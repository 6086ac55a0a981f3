import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { usersContracts } from '@shared/contracts/users';
import type { UpdateUserInput } from '@shared/schemas/auth';
import { usersQueryOptions } from './get-users';

export const updateUser = ({ id, ...patch }: UpdateUserInput & { id: string }) =>
  call(usersContracts.update, { params: { id }, body: patch });

export const useUpdateUser = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateUser,
    onSuccess: () => qc.invalidateQueries({ queryKey: usersQueryOptions().queryKey }),
  });
};
