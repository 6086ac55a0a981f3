import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { incidentsContracts } from '@shared/contracts/incidents';
import type { SparesInput } from '@shared/schemas/incidents';
import { sparesQueryOptions } from './get-spares';

export const setSpares = (venueId: string, body: SparesInput) => call(incidentsContracts.setSpares, { params: { id: venueId }, body });

export const useSetSpares = (venueId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: SparesInput) => setSpares(venueId, body),
    onSuccess: (answer) => {
      qc.setQueryData(sparesQueryOptions(venueId).queryKey, answer);
      // The pool's strip (its positions and steps) changed with it.
      if (answer.stripId) void qc.invalidateQueries({ queryKey: ['strips', answer.stripId] });
    },
  });
};
