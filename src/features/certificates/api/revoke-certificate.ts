import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { RevokeCertificateInput } from '@shared/schemas/sign-off';
import { certificatesQueryOptions } from './get-certificates';
import type { Verification } from './get-verification';

export const revokeCertificate = (number: string, input: RevokeCertificateInput) =>
  api.post<Verification>(`/certificates/${encodeURIComponent(number)}/revoke`, input);

export const useRevokeCertificate = (venueId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ number, reason }: { number: string; reason: string }) => revokeCertificate(number, { reason }),
    onSuccess: () => qc.invalidateQueries({ queryKey: certificatesQueryOptions(venueId).queryKey }),
  });
};
