import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { authContracts } from '@shared/contracts/auth';
import type { SignInInput } from '@shared/schemas/auth';
import { meQueryOptions } from './get-me';

export const signIn = (input: SignInInput) => call(authContracts.signIn, { body: input });

export const useSignIn = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (res) => {
      qc.clear();
      qc.setQueryData(meQueryOptions().queryKey, res.user);
    },
  });
};
