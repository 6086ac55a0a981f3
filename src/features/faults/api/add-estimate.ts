import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { FaultLocationRequest } from '@shared/schemas/fault-location';
import { faultQueryOptions, type CombinedDto, type FaultDetail, type FaultEstimateDto } from './get-fault';

/** The body of POST /api/fault-location, and the end the readings were taken from. */
export type EstimateBody = FaultLocationRequest & { fromEnd?: 'near' | 'far' };
export interface EstimateAnswer {
  estimate: FaultEstimateDto;
  combined: CombinedDto | null;
  fault: FaultDetail;
}

export const addEstimate = ({ faultId, body }: { faultId: string; body: EstimateBody }) =>
  api.post<EstimateAnswer>(`/faults/${faultId}/estimates`, body);

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
