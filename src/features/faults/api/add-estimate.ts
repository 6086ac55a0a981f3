import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { faultsContracts } from '@shared/contracts/faults';
import { faultQueryOptions } from './get-fault';

/** One fault-location request plus fromEnd, as the locate form builds it (the server checks it). */
export type EstimateBody = Record<string, number | string>;

export const addEstimate = ({ faultId, body }: { faultId: string; body: EstimateBody }) =>
  call(faultsContracts.addEstimate, { params: { id: faultId }, body });

export const useAddEstimate = (faultId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: EstimateBody) => addEstimate({ faultId, body }),
    onSuccess: (answer) => {
      qc.setQueryData(faultQueryOptions(faultId).queryKey, answer.fault);
      void qc.invalidateQueries({ queryKey: ['venues'] });
    },
  });
};
