import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { certificatesContracts } from '@shared/contracts/certificates';
import type { RevokeCertificateInput } from '@shared/schemas/sign-off';
import { certificatesQueryOptions } from './get-certificates';

export const revokeCertificate = (number: string, input: RevokeCertificateInput) =>
  call(certificatesContracts.revoke, { params: { number }, body: input });

export const useRevokeCertificate = (venueId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ number, reason }: { number: string; reason: string }) => revokeCertificate(number, { reason }),
    onSuccess: () => qc.invalidateQueries({ queryKey: certificatesQueryOptions(venueId).queryKey }),
  });
};
