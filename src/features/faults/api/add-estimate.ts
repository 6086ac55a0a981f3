import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { faultsContracts } from '@shared/contracts/faults';
import { faultQueryOptions } from './get-fault';
import type { FaultLocationRequest } from '@shared/schemas/fault-location';

/** The body of POST /api/fault-location, and the end the readings were taken from. */
export type EstimateBody = FaultLocationRequest & { fromEnd?: 'near' | 'far' };

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
