import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { PublicUser } from '@shared/schemas/auth';
import { meQueryOptions } from './get-me';

export const updatePreferences = (input: { unitSystem: 'metric' | 'imperial' }) =>
  api.put<{ user: PublicUser }>('/auth/preferences', input);

export const useUpdatePreferences = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updatePreferences,
    onSuccess: (res) => qc.setQueryData(meQueryOptions().queryKey, res.user),
  });
};
