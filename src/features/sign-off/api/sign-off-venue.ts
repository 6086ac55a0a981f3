import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { signOffContracts, type SignOffResult } from '@shared/contracts/sign-off';
import type { SignOffInput } from '@shared/schemas/sign-off';
import { readinessQueryOptions } from './get-readiness';

export type { SignOffResult };
export type IssuedCertificate = SignOffResult['certificates'][number];

export const signOffVenue = (venueId: string, input: SignOffInput) =>
  call(signOffContracts.signOff, { params: { id: venueId }, body: input });

export const useSignOffVenue = (venueId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: SignOffInput) => signOffVenue(venueId, input),
    // The venue's status, its certificates and every list showing it change.
    onSettled: () => qc.invalidateQueries({ queryKey: readinessQueryOptions(venueId).queryKey.slice(0, 1) }),
  });
};
