import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { PublicUser, SignInInput } from '@shared/schemas/auth';
import { meQueryOptions } from './get-me';

export const signIn = (input: SignInInput) => api.post<{ user: PublicUser }>('/auth/sign-in', input);

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
