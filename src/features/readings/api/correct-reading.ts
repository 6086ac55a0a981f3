import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { venueReadingsQueryOptions } from './get-venue-readings';

export interface CorrectionInput {
  stepId: string;
  value: string;
  supersedesId: string;
  correctionReason: string;
}

/** A correction is a new reading that supersedes the old one; the old one stays in the history. */
export const correctReading = (input: CorrectionInput) => api.post<{ id: string; verdict: string }>('/readings', { id: crypto.randomUUID(), ...input });

export const useCorrectReading = (venueId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: correctReading,
    onSuccess: () => qc.invalidateQueries({ queryKey: venueReadingsQueryOptions(venueId).queryKey }),
  });
};
