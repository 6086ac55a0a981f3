import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { authContracts } from '@shared/contracts/auth';
import { meQueryOptions } from './get-me';

export const updatePreferences = (input: { unitSystem: 'metric' | 'imperial' }) => call(authContracts.preferences, { body: input });

export const useUpdatePreferences = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updatePreferences,
    onSuccess: (res) => qc.setQueryData(meQueryOptions().queryKey, res.user),
  });
};
