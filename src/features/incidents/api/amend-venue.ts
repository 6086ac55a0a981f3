import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { incidentsContracts, type AmendmentResult } from '@shared/contracts/incidents';
import type { AmendmentInput } from '@shared/schemas/incidents';

export type { AmendmentResult };

export const amendVenue = (venueId: string, body: AmendmentInput) => call(incidentsContracts.amend, { params: { id: venueId }, body });

export const useAmendVenue = (venueId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: AmendmentInput) => amendVenue(venueId, body),
    // The incidents, the board, the certificates and every list showing the venue change.
    onSettled: () => qc.invalidateQueries({ queryKey: ['venues'] }),
  });
};
