import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { UpdateProfileInput } from '@shared/schemas/limit-profile';
import { profilesQueryOptions } from './get-profiles';
import type { ProfileDetail } from './types';

/** Saves the edit as a new version; If-Match names the latest version the editor started from. */
export const updateProfile = ({ id, version, body }: { id: string; version: number; body: UpdateProfileInput }) =>
  api.put<ProfileDetail>(`/profiles/${id}`, body as Record<string, unknown>, { 'If-Match': `"${version}"` });

export const useUpdateProfile = () => {
  const qc = useQueryClient();
  // The list and every profile detail share the prefix.
  return useMutation({ mutationFn: updateProfile, onSuccess: () => qc.invalidateQueries({ queryKey: profilesQueryOptions().queryKey }) });
};
