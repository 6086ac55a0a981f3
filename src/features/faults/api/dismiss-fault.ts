import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { DismissFaultInput } from '@shared/schemas/faults';
import { faultQueryOptions, type FaultDetail } from './get-fault';

/** The event's director closes a fault that was a typing mistake; If-Match is the version the page loaded. */
export const dismissFault = ({ faultId, version, body }: { faultId: string; version: number; body: DismissFaultInput }) =>
  api.post<FaultDetail>(`/faults/${faultId}/dismiss`, body as unknown as Record<string, unknown>, { 'If-Match': `"${version}"` });

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
