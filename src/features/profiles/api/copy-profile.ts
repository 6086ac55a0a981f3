import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { profilesQueryOptions } from './get-profiles';
import type { ProfileDetail } from './types';

export const copyProfile = ({ id, name }: { id: string; name: string }) => api.post<ProfileDetail>(`/profiles/${id}/copy`, { name });

export const useCopyProfile = () => {
  const qc = useQueryClient();
  return useMutation({ mutationFn: copyProfile, onSuccess: () => qc.invalidateQueries({ queryKey: profilesQueryOptions().queryKey }) });
};
