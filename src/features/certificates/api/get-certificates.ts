import { queryOptions, useQuery } from '@tanstack/react-query';
import { call, urlOf } from '@/lib/api-client';
import {
  certificatesContracts,
  type CertificateStatus,
  type CertificateSummary,
  type VenueCertificates,
} from '@shared/contracts/certificates';

export type { CertificateStatus, CertificateSummary, VenueCertificates };

export const getCertificates = (venueId: string) => call(certificatesContracts.ofVenue, { params: { id: venueId } });
export const certificatesQueryOptions = (venueId: string) =>
  queryOptions({ queryKey: ['venues', venueId, 'certificates'], queryFn: () => getCertificates(venueId) });
export const useCertificates = (venueId: string) => useQuery(certificatesQueryOptions(venueId));

/** Plain links: the browser downloads them with the session cookie. */
export const certificatePdfUrl = (number: string) => urlOf(certificatesContracts.pdf, { number });
export const certificatesZipUrl = (venueId: string) => urlOf(certificatesContracts.zip, { id: venueId });
