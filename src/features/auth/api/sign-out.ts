import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { authContracts } from '@shared/contracts/auth';
import { meQueryOptions } from './get-me';

export const signOut = () => call(authContracts.signOut);

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
