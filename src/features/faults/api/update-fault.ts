import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { faultsContracts } from '@shared/contracts/faults';
import type { UpdateFaultInput } from '@shared/schemas/faults';
import { faultQueryOptions } from './get-fault';

/** Sends the version the page loaded as If-Match; a 412 means someone changed the fault meanwhile. */
export const updateFault = ({ faultId, version, patch }: { faultId: string; version: number; patch: UpdateFaultInput }) =>
  call(faultsContracts.update, { params: { id: faultId }, body: patch, headers: { 'If-Match': `"${version}"` } });

export const useUpdateFault = (faultId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (v: { version: number; patch: UpdateFaultInput }) => updateFault({ faultId, ...v }),
    onSuccess: (fault) => qc.setQueryData(faultQueryOptions(faultId).queryKey, fault),
    onError: () => qc.invalidateQueries({ queryKey: faultQueryOptions(faultId).queryKey }),
  });
};
