import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { profilesContracts } from '@shared/contracts/profiles';
import { profilesQueryOptions } from './get-profiles';

export const copyProfile = ({ id, name }: { id: string; name: string }) => call(profilesContracts.copy, { params: { id }, body: { name } });

export const useCopyProfile = () => {
  const qc = useQueryClient();
  return useMutation({ mutationFn: copyProfile, onSuccess: () => qc.invalidateQueries({ queryKey: profilesQueryOptions().queryKey }) });
};
