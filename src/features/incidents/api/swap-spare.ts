import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { incidentsContracts } from '@shared/contracts/incidents';
import type { SwapInput } from '@shared/schemas/incidents';
import { incidentQueryOptions } from './get-incident';
import { sparesQueryOptions } from './get-spares';

export const swapSpare = (incidentId: string, body: SwapInput) => call(incidentsContracts.swap, { params: { id: incidentId }, body });

export const useSwapSpare = (incidentId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: SwapInput) => swapSpare(incidentId, body),
    onSuccess: (answer) => {
      qc.setQueryData(incidentQueryOptions(incidentId).queryKey, answer);
      // The strip now holds the spare; the pool lost it; the register has the removed item to inspect.
      void qc.invalidateQueries({ queryKey: ['strips', answer.incident.stripId] });
      void qc.invalidateQueries({ queryKey: sparesQueryOptions(answer.incident.venueId).queryKey });
      void qc.invalidateQueries({ queryKey: ['venues', answer.incident.venueId] });
      void qc.invalidateQueries({ queryKey: ['equipment'] });
    },
  });
};
