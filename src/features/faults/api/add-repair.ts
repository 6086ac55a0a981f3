import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CreateRepairInput } from '@shared/schemas/faults';
import { faultQueryOptions, type FaultDetail } from './get-fault';

export const addRepair = ({ faultId, body }: { faultId: string; body: CreateRepairInput }) =>
  api.post<{ repair: FaultDetail['repairs'][number]; fault: FaultDetail }>(`/faults/${faultId}/repairs`, body as unknown as Record<string, unknown>);

export const useAddRepair = (faultId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateRepairInput) => addRepair({ faultId, body }),
    onSuccess: (answer) => {
      qc.setQueryData(faultQueryOptions(faultId).queryKey, answer.fault);
      // The strip's item (length, swap) and every progress view changed.
      void qc.invalidateQueries({ queryKey: ['strips', answer.fault.stripId] });
      void qc.invalidateQueries({ queryKey: ['venues'] });
    },
  });
};
