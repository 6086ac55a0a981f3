import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { faultsContracts } from '@shared/contracts/faults';
import type { DismissFaultInput } from '@shared/schemas/faults';
import { faultQueryOptions } from './get-fault';

/** The event's director closes a fault that was a typing mistake; If-Match is the version the page loaded. */
export const dismissFault = ({ faultId, version, body }: { faultId: string; version: number; body: DismissFaultInput }) =>
  call(faultsContracts.dismiss, { params: { id: faultId }, body, headers: { 'If-Match': `"${version}"` } });

export const useDismissFault = (faultId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (v: { version: number; body: DismissFaultInput }) => dismissFault({ faultId, ...v }),
    onSuccess: (fault) => {
      qc.setQueryData(faultQueryOptions(faultId).queryKey, fault);
      // The strip may be clear now: its screen and every progress view change.
      void qc.invalidateQueries({ queryKey: ['strips', fault.stripId] });
      void qc.invalidateQueries({ queryKey: ['venues'] });
    },
    onError: () => qc.invalidateQueries({ queryKey: faultQueryOptions(faultId).queryKey }),
  });
};
