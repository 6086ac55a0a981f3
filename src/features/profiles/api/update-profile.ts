import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { profilesContracts } from '@shared/contracts/profiles';
import type { UpdateProfileInput } from '@shared/schemas/limit-profile';
import { profilesQueryOptions } from './get-profiles';

/** Saves the edit as a new version; If-Match names the latest version the editor started from. */
export const updateProfile = ({ id, version, body }: { id: string; version: number; body: UpdateProfileInput }) =>
  call(profilesContracts.update, { params: { id }, body, headers: { 'If-Match': `"${version}"` } });

export const useUpdateProfile = () => {
  const qc = useQueryClient();
  // The list and every profile detail share the prefix.
  return useMutation({ mutationFn: updateProfile, onSuccess: () => qc.invalidateQueries({ queryKey: profilesQueryOptions().queryKey }) });
};
