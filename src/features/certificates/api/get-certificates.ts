import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export type CertificateStatus = 'valid' | 'superseded' | 'revoked';
export interface CertificateSummary {
  number: string;
  kind: 'venue' | 'strip';
  stripId: string | null;
  stripLabel: string | null;
  status: CertificateStatus;
  issuedAt: string;
  signOffId: string;
  signedBy: string;
  signedAt: string;
  supersededAt: string | null;
  revokedAt: string | null;
  revokedReason: string | null;
  pdfSha256: string | null;
  verifyUrl: string;
}
export interface VenueCertificates {
  venue: { id: string; name: string; status: string };
  event: { id: string; name: string; startsOn: string; endsOn: string };
  canRevoke: boolean;
  certificates: CertificateSummary[];
}

export const getCertificates = (venueId: string) => api.get<VenueCertificates>(`/venues/${venueId}/certificates`);
export const certificatesQueryOptions = (venueId: string) =>
  queryOptions({ queryKey: ['venues', venueId, 'certificates'], queryFn: () => getCertificates(venueId) });
export const useCertificates = (venueId: string) => useQuery(certificatesQueryOptions(venueId));

/** Plain links: the browser downloads them with the session cookie. */
export const certificatePdfUrl = (number: string) => `/api/certificates/${encodeURIComponent(number)}/pdf`;
export const certificatesZipUrl = (venueId: string) => `/api/venues/${encodeURIComponent(venueId)}/certificates.zip`;
