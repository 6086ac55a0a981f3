import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SignOffInput } from '@shared/schemas/sign-off';
import { readinessQueryOptions } from './get-readiness';

export interface IssuedCertificate {
  number: string;
  kind: 'venue' | 'strip';
  stripId?: string;
  status: 'valid';
  pdfSha256: string;
  verifyUrl: string;
}
export interface SignOffResult {
  signOffId: string;
  signedAt: string;
  certificates: IssuedCertificate[];
}

export const signOffVenue = (venueId: string, input: SignOffInput) =>
  api.post<SignOffResult>(`/venues/${venueId}/sign-off`, input as unknown as Record<string, unknown>);

export const useSignOffVenue = (venueId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: SignOffInput) => signOffVenue(venueId, input),
    // The venue's status, its certificates and every list showing it change.
    onSettled: () => qc.invalidateQueries({ queryKey: readinessQueryOptions(venueId).queryKey.slice(0, 1) }),
  });
};
