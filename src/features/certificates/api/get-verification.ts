import { queryOptions, useQuery } from '@tanstack/react-query';
import { ApiError, call } from '@/lib/api-client';
import { certificatesContracts, type Verification } from '@shared/contracts/certificates';

export type { Verification };

/** Null when no certificate has that number. */
export const getVerification = async (number: string): Promise<Verification | null> => {
  try {
    return await call(certificatesContracts.verify, { params: { number } });
  } catch (err) {
    if (err instanceof ApiError && err.status === 404) return null;
    throw err;
  }
};
export const verificationQueryOptions = (number: string) =>
  queryOptions({ queryKey: ['verify', number], queryFn: () => getVerification(number) });
export const useVerification = (number: string) => useQuery(verificationQueryOptions(number));
