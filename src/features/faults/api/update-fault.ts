import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { UpdateFaultInput } from '@shared/schemas/faults';
import { faultQueryOptions, type FaultDetail } from './get-fault';

/** Sends the version the page loaded as If-Match; a 412 means someone changed the fault meanwhile. */
export const updateFault = ({ faultId, version, patch }: { faultId: string; version: number; patch: UpdateFaultInput }) =>
  api.patch<FaultDetail>(`/faults/${faultId}`, patch as unknown as Record<string, unknown>, { 'If-Match': `"${version}"` });

export const useUpdateFault = (faultId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (v: { version: number; patch: UpdateFaultInput }) => updateFault({ faultId, ...v }),
    onSuccess: (fault) => qc.setQueryData(faultQueryOptions(faultId).queryKey, fault),
    onError: () => qc.invalidateQueries({ queryKey: faultQueryOptions(faultId).queryKey }),
  });
};
