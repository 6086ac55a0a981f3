import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { meQueryOptions } from './get-me';

export const signOut = () => api.post<void>('/auth/sign-out');

export const useSignOut = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSettled: () => {
      qc.clear();
      qc.setQueryData(meQueryOptions().queryKey, null);
    },
  });
};
