import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { incidentsContracts } from '@shared/contracts/incidents';
import { incidentQueryOptions } from './get-incident';

export const resolveIncident = (incidentId: string) => call(incidentsContracts.resolve, { params: { id: incidentId } });

/** A 409 `retest-incomplete` carries `missing`: the steps still to measure (shown by the caller). */
export const useResolveIncident = (incidentId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => resolveIncident(incidentId),
    onSuccess: (answer) => {
      qc.setQueryData(incidentQueryOptions(incidentId).queryKey, answer);
      void qc.invalidateQueries({ queryKey: ['strips', answer.incident.stripId] });
      void qc.invalidateQueries({ queryKey: ['venues', answer.incident.venueId] });
    },
    // A refusal may mean the list changed meanwhile: show the server's current one.
    onError: () => void qc.invalidateQueries({ queryKey: incidentQueryOptions(incidentId).queryKey }),
  });
};
