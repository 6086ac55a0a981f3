import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { faultsContracts } from '@shared/contracts/faults';
import type { CreateRepairInput } from '@shared/schemas/faults';
import { faultQueryOptions } from './get-fault';

export const addRepair = ({ faultId, body }: { faultId: string; body: CreateRepairInput }) =>
  call(faultsContracts.addRepair, { params: { id: faultId }, body });

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
