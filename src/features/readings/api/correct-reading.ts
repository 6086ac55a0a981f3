import { useMutation, useQueryClient } from '@tanstack/react-query';
import { v7 as uuidv7 } from 'uuid';
import { call } from '@/lib/api-client';
import { readingsContracts } from '@shared/contracts/readings';
import { venueReadingsQueryOptions } from './get-venue-readings';

export interface CorrectionInput {
  stepId: string;
  value: string;
  supersedesId: string;
  correctionReason: string;
  /** The corrected reading's test-lead null: a correction fixes what was typed, not the measurement. */
  leadNullId?: string | null;
}

/**
 * A correction is a new reading that supersedes the old one; the old one stays in the history. Its
 * id comes from uuid, not crypto.randomUUID, which plain-HTTP venue networks do not have.
 */
export const correctReading = (input: CorrectionInput) => call(readingsContracts.record, { body: { id: uuidv7(), ...input } });

export const useCorrectReading = (venueId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: correctReading,
    onSuccess: () => qc.invalidateQueries({ queryKey: venueReadingsQueryOptions(venueId).queryKey }),
  });
};
