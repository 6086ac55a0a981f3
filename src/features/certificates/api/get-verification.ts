import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, ApiError } from '@/lib/api-client';
import type { CertificateStatus } from './get-certificates';

export interface Verification {
  status: CertificateStatus;
  number: string;
  kind: 'venue' | 'strip';
  event: string;
  eventDates: { startsOn: string; endsOn: string };
  venue: string;
  strips: string[];
  /** A venue certificate's strips whose own certificates were revoked: it no longer covers them. */
  notCovering: { strip: string; number: string; revokedAt: string | null; revokedReason: string | null }[];
  organisation: string;
  issuedAt: string;
  signedBy: string;
  signedAt: string;
  profile: { name: string; version: number };
  items: number;
  readings: number;
  supersededAt: string | null;
  revokedAt: string | null;
  revokedReason: string | null;
  keyId: string;
  jws: string;
  pdfSha256: string | null;
  verifyUrl: string;
}

/** Null when no certificate has that number. */
export const getVerification = async (number: string): Promise<Verification | null> => {
  try {
    return await api.get<Verification>(`/verify/${encodeURIComponent(number)}`);
  } catch (err) {
    if (err instanceof ApiError && err.status === 404) return null;
    throw err;
  }
};
export const verificationQueryOptions = (number: string) =>
  queryOptions({ queryKey: ['verify', number], queryFn: () => getVerification(number) });
export const useVerification = (number: string) => useQuery(verificationQueryOptions(number));
