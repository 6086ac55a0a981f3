import { useMutation } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { faultsContracts } from '@shared/contracts/faults';

export interface TraceEstimateBody {
  method: 'tdr';
  roundTripNs: number;
  velocityFactor: number;
  riseTimeNs?: number;
  fromEnd: 'near';
}

/** The estimate goes to the fault's estimates (POST /api/faults/:id/estimates), like any other method. */
export const saveTraceEstimate = ({ faultId, body }: { faultId: string; body: TraceEstimateBody }) =>
  call(faultsContracts.addEstimate, { params: { id: faultId }, body });

/** The fault's own query lives in the faults feature: the page passes `onSaved` to refresh it. */
export const useSaveTraceEstimate = (faultId: string, onSaved?: () => void) =>
  useMutation({ mutationFn: (body: TraceEstimateBody) => saveTraceEstimate({ faultId, body }), onSuccess: () => onSaved?.() });
